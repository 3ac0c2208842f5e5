package org.skerry.spark.checkpoint;

import java.io.IOException;
import java.io.Serializable;
import java.net.URI;
import java.util.Map;
import java.util.TreeMap;
import org.apache.hadoop.conf.Configuration;
import org.apache.hadoop.fs.FSDataOutputStream;
import org.apache.hadoop.fs.FileSystem;
import org.apache.hadoop.fs.LocalFileSystem;
import org.apache.hadoop.fs.Path;

/**
 * How checkpoint code reaches a file system, on the driver and on executors alike: a URI plus the
 * Hadoop settings to open it with (the {@code spark.hadoop.*} entries of the run). The local file
 * system is used raw, without Hadoop's {@code .crc} side files: our manifest holds the checksums.
 * Immutable and serialisable, so it travels inside block stores.
 */
public final class CheckpointFileSystem implements Serializable {

    private static final long serialVersionUID = 1L;

    private final String root;
    private final TreeMap<String, String> hadoopSettings;
    private transient FileSystem fileSystem;

    /**
     * @param root           the checkpoint root, a URI such as {@code file:/data/run/checkpoints}
     *                       or {@code hdfs://namenode:8020/user/me/run}
     * @param hadoopSettings Hadoop configuration entries (without the {@code spark.hadoop.} prefix)
     */
    public CheckpointFileSystem(String root, Map<String, String> hadoopSettings) {
        if (root == null || root.isEmpty()) {
            throw new IllegalArgumentException("root must not be empty");
        }
        this.root = root.endsWith("/") ? root.substring(0, root.length() - 1) : root;
        this.hadoopSettings = new TreeMap<>(hadoopSettings);
    }

    /** The root URI as given. */
    public String root() {
        return root;
    }

    /** {@code root/child}. */
    public Path path(String child) {
        return new Path(root + "/" + child);
    }

    /** The root as a Hadoop path. */
    public Path rootPath() {
        return new Path(root);
    }

    /** The scheme of the root ({@code file} for a plain path). */
    public String scheme() {
        String scheme = URI.create(root).getScheme();
        return scheme == null ? "file" : scheme;
    }

    /** The file system, opened once per JVM that holds this object. */
    public synchronized FileSystem fileSystem() throws IOException {
        if (fileSystem == null) {
            Configuration conf = new Configuration();
            hadoopSettings.forEach(conf::set);
            FileSystem fs = FileSystem.get(URI.create(root), conf);
            fileSystem = fs instanceof LocalFileSystem ? ((LocalFileSystem) fs).getRaw() : fs;
        }
        return fileSystem;
    }

    /**
     * Moves {@code temporary} to {@code target}, replacing it: rename is the only step that makes a
     * file visible under its real name.
     */
    public void publish(Path temporary, Path target) throws IOException {
        FileSystem fs = fileSystem();
        if (fs.exists(target)) {
            fs.delete(target, false);
        }
        if (!fs.rename(temporary, target)) {
            throw new IOException("cannot rename " + temporary + " to " + target);
        }
    }

    /** Creates {@code path} for writing, replacing any file of that name. */
    public FSDataOutputStream create(Path path) throws IOException {
        return fileSystem().create(path, true);
    }
}
