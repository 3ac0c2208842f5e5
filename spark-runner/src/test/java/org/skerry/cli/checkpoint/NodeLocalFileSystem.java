package org.skerry.cli.checkpoint;

import java.io.File;
import java.net.URI;
import org.apache.hadoop.fs.Path;
import org.apache.hadoop.fs.RawLocalFileSystem;

/**
 * A local file system under the scheme {@code nodelocal:} that gives every "node" its own disk:
 * in a JVM started with {@code -Dskerry.test.node=NAME} (an executor, say) each path maps to a
 * sibling folder suffixed with the name, so files the driver writes are not there. It stands in
 * for a checkpoint path on one machine's local disk in a multi-node cluster.
 */
public final class NodeLocalFileSystem extends RawLocalFileSystem {

    @Override
    public URI getUri() {
        return URI.create("nodelocal:///");
    }

    @Override
    public String getScheme() {
        return "nodelocal";
    }

    @Override
    public File pathToFile(Path path) {
        File file = super.pathToFile(path);
        String node = System.getProperty("skerry.test.node");
        return node == null ? file : new File(file.getPath().replaceFirst("^(/[^/]+/[^/]+)", "$1-" + node));
    }
}
