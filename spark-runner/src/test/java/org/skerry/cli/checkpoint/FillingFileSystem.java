package org.skerry.cli.checkpoint;

import java.io.IOException;
import java.net.URI;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.apache.hadoop.fs.FSDataOutputStream;
import org.apache.hadoop.fs.Path;
import org.apache.hadoop.fs.RawLocalFileSystem;
import org.apache.hadoop.fs.permission.FsPermission;
import org.apache.hadoop.util.Progressable;

/**
 * A local file system under the scheme {@code fillingfs:} that "fills up" after a given
 * checkpoint: creating any file of a later iteration's checkpoint fails as a full disk does. The
 * fault is tied to an observable event (which iteration's files are written), not to a timer.
 * Hadoop setting {@code test.filling.last-iteration}: the last iteration whose files still fit.
 */
public final class FillingFileSystem extends RawLocalFileSystem {

    private static final Pattern ITERATION = Pattern.compile("iteration-(\\d+)");

    @Override
    public URI getUri() {
        return URI.create("fillingfs:///");
    }

    @Override
    public String getScheme() {
        return "fillingfs";
    }

    private void refuseWhenFull(Path path) throws IOException {
        int last = getConf().getInt("test.filling.last-iteration", Integer.MAX_VALUE);
        Matcher m = ITERATION.matcher(path.toString());
        if (m.find() && Integer.parseInt(m.group(1)) > last) {
            throw new IOException("No space left on device: " + path);
        }
    }

    @Override
    public FSDataOutputStream create(Path path, boolean overwrite, int bufferSize, short replication, long blockSize,
            Progressable progress) throws IOException {
        refuseWhenFull(path);
        return super.create(path, overwrite, bufferSize, replication, blockSize, progress);
    }

    @Override
    public FSDataOutputStream create(Path path, FsPermission permission, boolean overwrite, int bufferSize,
            short replication, long blockSize, Progressable progress) throws IOException {
        refuseWhenFull(path);
        return super.create(path, permission, overwrite, bufferSize, replication, blockSize, progress);
    }

    @Override
    public boolean mkdirs(Path path) throws IOException {
        refuseWhenFull(path);
        return super.mkdirs(path);
    }
}
