package org.skerry.miniyarn;

import java.io.IOException;
import java.io.OutputStream;
import java.net.InetSocketAddress;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.concurrent.CountDownLatch;
import org.apache.hadoop.conf.Configuration;
import org.apache.hadoop.net.NetUtils;
import org.apache.hadoop.yarn.conf.YarnConfiguration;
import org.apache.hadoop.yarn.server.MiniYARNCluster;

/**
 * Starts Hadoop's mini YARN cluster (one resource manager, one node manager) in this JVM, writes
 * its client configuration as {@code yarn-site.xml} and {@code core-site.xml} into a folder that a
 * client uses as {@code HADOOP_CONF_DIR}, and runs until the process is stopped (SIGTERM stops the
 * cluster and the containers its node manager started). Its working folders go under the current
 * directory ({@code target/} there, as the mini cluster places them).
 *
 * <p>Arguments: the configuration folder, then the queues to create besides {@code default}
 * (each gets an equal share of the cluster).
 */
public final class MiniYarnMain {

    /** Memory the node manager offers: room for an application master and two small executors. */
    private static final int NODE_MEMORY_MB = 4096;

    private MiniYarnMain() {
    }

    public static void main(String[] args) {
        try {
            run(args);
        } catch (Throwable e) {
            // The cluster's threads would keep the JVM alive after a failed start: exit, so the
            // test that waits for the configuration sees the process end.
            e.printStackTrace();
            System.exit(1);
        }
    }

    private static void run(String[] args) throws Exception {
        if (args.length < 1) {
            System.err.println("usage: MiniYarnMain CONF_DIR [QUEUE...]");
            System.exit(2);
        }
        Path confDir = Path.of(args[0]).toAbsolutePath();
        Files.createDirectories(confDir);

        YarnConfiguration conf = new YarnConfiguration();
        // The test machine is small and shared: no memory policing of containers (a JVM's virtual
        // size is far above its heap), no node marked unhealthy for a nearly full disk.
        conf.setBoolean(YarnConfiguration.NM_PMEM_CHECK_ENABLED, false);
        conf.setBoolean(YarnConfiguration.NM_VMEM_CHECK_ENABLED, false);
        conf.setInt(YarnConfiguration.NM_PMEM_MB, NODE_MEMORY_MB);
        conf.setInt(YarnConfiguration.NM_VCORES, 4);
        conf.setInt(YarnConfiguration.RM_SCHEDULER_MINIMUM_ALLOCATION_MB, 128);
        conf.setFloat(YarnConfiguration.NM_MAX_PER_DISK_UTILIZATION_PERCENTAGE, 99.9f);
        // One attempt: a failing application master fails the application at once.
        conf.setInt(YarnConfiguration.RM_AM_MAX_ATTEMPTS, 1);
        String queues = "default";
        for (int i = 1; i < args.length; i++) {
            queues += "," + args[i];
        }
        String[] names = queues.split(",");
        conf.set("yarn.scheduler.capacity.root.queues", queues);
        for (int i = 0; i < names.length; i++) {
            // Shares that sum to exactly 100 (the scheduler checks).
            float share = i < names.length - 1 ? (float) Math.floor(100.0 / names.length)
                    : 100f - (names.length - 1) * (float) Math.floor(100.0 / names.length);
            conf.setFloat("yarn.scheduler.capacity.root." + names[i] + ".capacity", share);
            conf.setFloat("yarn.scheduler.capacity.root." + names[i] + ".maximum-capacity", 100f);
        }

        MiniYARNCluster cluster = new MiniYARNCluster("skerry-mini-yarn", 1, 1, 1);
        CountDownLatch stopped = new CountDownLatch(1);
        Runtime.getRuntime().addShutdownHook(new Thread(() -> {
            cluster.stop();
            stopped.countDown();
        }, "mini-yarn-stop"));
        cluster.init(conf);
        cluster.start();

        // The resource manager binds its ports while starting; wait until its address is real.
        Configuration started = cluster.getConfig();
        long deadline = System.nanoTime() + 60_000_000_000L;
        while (portOf(started.get(YarnConfiguration.RM_ADDRESS)) == 0) {
            if (System.nanoTime() > deadline) {
                throw new IllegalStateException("the resource manager did not bind its address in 60 s");
            }
            Thread.sleep(100);
            started = cluster.getConfig();
        }
        // A client whose cluster is gone gives up after a minute, not after Hadoop's 15.
        started.setLong(YarnConfiguration.RESOURCEMANAGER_CONNECT_MAX_WAIT_MS, 60_000);
        for (String file : new String[] {"core-site.xml", "yarn-site.xml"}) {
            write(started, confDir.resolve(file));
        }
        System.out.println("mini YARN cluster up: resource manager at " + started.get(YarnConfiguration.RM_ADDRESS)
                + ", configuration in " + confDir);
        System.out.flush();
        stopped.await();
    }

    private static int portOf(String address) {
        if (address == null) {
            return 0;
        }
        InetSocketAddress socket = NetUtils.createSocketAddr(address);
        return socket.getPort();
    }

    /** Writes the whole configuration, then renames it into place, so a reader never sees half. */
    private static void write(Configuration conf, Path file) throws IOException {
        Path partial = file.resolveSibling(file.getFileName() + ".partial");
        try (OutputStream out = Files.newOutputStream(partial)) {
            conf.writeXml(out);
        }
        Files.move(partial, file, StandardCopyOption.ATOMIC_MOVE, StandardCopyOption.REPLACE_EXISTING);
    }
}
