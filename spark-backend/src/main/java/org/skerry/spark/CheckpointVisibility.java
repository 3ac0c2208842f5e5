package org.skerry.spark;

import java.io.IOException;
import java.net.InetAddress;
import java.util.ArrayList;
import java.util.List;
import java.util.TreeSet;
import java.util.UUID;
import org.apache.hadoop.fs.Path;
import org.skerry.checkpoint.CheckpointFileSystem;
import org.skerry.checkpoint.CheckpointFolder;
import org.apache.spark.api.java.JavaSparkContext;

/**
 * Checks before a run that every executor sees the checkpoint folder the driver writes to: on a
 * multi-node cluster a path on one node's local disk would let executors write blocks where the
 * driver (and a resumed run) can never find them. The driver writes a probe file; tasks spread
 * over the executors look for it.
 */
public final class CheckpointVisibility {

    private CheckpointVisibility() {
    }

    /**
     * @throws IllegalArgumentException naming the path and the hosts that cannot see it
     */
    public static void check(JavaSparkContext context, CheckpointFolder folder) throws IOException {
        String token = UUID.randomUUID().toString();
        CheckpointFileSystem files = folder.files();
        Path probe = folder.writeProbe(token);
        String probeName = probe.getName();
        try {
            int tasks = Math.max(2, 2 * context.defaultParallelism());
            List<Integer> slots = new ArrayList<>();
            for (int i = 0; i < tasks; i++) {
                slots.add(i);
            }
            List<String> blind = context.parallelize(slots, tasks).map(slot -> {
                boolean seen = files.fileSystem().exists(files.path(probeName));
                return seen ? "" : InetAddress.getLocalHost().getHostName();
            }).collect();
            TreeSet<String> hosts = new TreeSet<>(blind);
            hosts.remove("");
            if (!hosts.isEmpty()) {
                throw new IllegalArgumentException("checkpoint.path = " + files.root() + " is not visible from "
                        + "executors on " + hosts + ": on a multi-node cluster put checkpoints where every node "
                        + "sees them (a shared file system, or HDFS: hdfs://…) and set checkpoint.path");
            }
        } finally {
            files.fileSystem().delete(probe, false);
        }
    }
}
