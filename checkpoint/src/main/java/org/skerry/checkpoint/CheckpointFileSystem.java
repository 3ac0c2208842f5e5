package org.skerry.checkpoint;

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
import org.apache.hadoop.fs.RawLocalFileSystem;

/**
 * How checkpoint code reaches a file system, on the driver and on executors alike: a URI plus the
 * Hadoop settings to open it with (the {@code spark.hadoop.*} entries of the run). The local file
 * system is used raw, without Hadoop's {@code .crc} side files: our manifest holds the checksums.
 * Immutable and serialisable, so it travels inside block stores.
 *
 * <p>The local file system ({@code file:} URIs and plain paths) is opened directly, not through
 * {@link FileSystem#get}: that goes through Hadoop's file-system cache, whose key asks
 * {@code UserGroupInformation} for the current user, and Hadoop's client (seen with 3.4.2) does that with
 * {@code Subject.getSubject}, which Java 23 and newer refuse ("getSubject is not supported").
 * The raw local file system needs no user, so checkpoints on local or shared folders work on every
 * Java skerry supports; the bytes written are the same either way. Other schemes (HDFS, S3 …)
 * still need {@code FileSystem.get}: {@link #unsupportedOnThisJava} says when they cannot work.
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

    /** The file system, opened once per copy of this object (on executors: once per task). */
    public synchronized FileSystem fileSystem() throws IOException {
        if (fileSystem == null) {
            Configuration conf = new Configuration();
            hadoopSettings.forEach(conf::set);
            if (scheme().equals("file") && !hadoopSettings.containsKey("fs.file.impl")) {
                RawLocalFileSystem local = new RawLocalFileSystem();
                local.initialize(URI.create("file:///"), conf);
                fileSystem = local;
            } else {
                FileSystem fs = FileSystem.get(URI.create(root), conf);
                fileSystem = fs instanceof LocalFileSystem ? ((LocalFileSystem) fs).getRaw() : fs;
            }
        }
        return fileSystem;
    }

    /**
     * Why checkpoints under {@code root} cannot be written on the Java running now, or null when
     * they can: a scheme other than {@code file} goes through Hadoop's user login, which needs
     * {@code Subject.getSubject} — refused by Java 23 and newer (unless Java 23 runs with
     * {@code -Djava.security.manager=allow}).
     */
    public static String unsupportedOnThisJava(String root) {
        String scheme = new Path(root).toUri().getScheme();
        if (scheme == null || scheme.equals("file") || subjectLookupWorks()) {
            return null;
        }
        return scheme + ": file systems need Hadoop's user login, which calls Subject.getSubject, and Java "
                + Runtime.version().feature() + " no longer supports it (nor does any Java from 23 on); run skerry on "
                + "Java 17 to 22 for " + scheme + ": checkpoints, or put them in a local or shared folder (a plain path)";
    }

    @SuppressWarnings("removal")
    private static boolean subjectLookupWorks() {
        try {
            javax.security.auth.Subject.getSubject(java.security.AccessController.getContext());
            return true;
        } catch (UnsupportedOperationException e) {
            return false;
        }
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
