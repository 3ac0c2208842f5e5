package org.skerry.engine.process;

import java.io.File;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;

/**
 * Starts every child process of this JVM from one thread that lives as long as the JVM, so that
 * no child outlives it, even when the JVM is killed with SIGKILL.
 *
 * <p>Where util-linux's {@code setpriv} is installed (Linux), each program is started through
 * {@code setpriv --pdeathsig KILL}, which asks the kernel to kill the program when the thread that
 * started it ends. Linux ties that signal to the starting <em>thread</em>, not the process, hence
 * the one long-lived launcher thread: a pool thread that ends would kill the workers it happened
 * to start. Every child is also registered and its whole process tree killed by a shutdown hook
 * on an orderly exit (SIGTERM, Ctrl-C, the end of the run), and a worker is expected to exit when
 * its standard input closes, which the kernel does when the JVM dies: three layers, since a
 * machine without {@code setpriv} has only the last two. The parent-death signal reaches the
 * program only, not the children a wrapper script starts; so each program also leads a process
 * group of its own, which {@link GroupReaper} kills when the program ends or the JVM dies.
 */
public final class ProcessLauncher {

    private static final Set<ChildProcess> LIVE = ConcurrentHashMap.newKeySet();
    private static final ExecutorService THREAD = Executors.newSingleThreadExecutor(task -> {
        Thread thread = new Thread(task, "skerry-process-launcher");
        thread.setDaemon(true);
        return thread;
    });
    private static final String DEATH_SIGNAL_HELPER = findDeathSignalHelper();

    static {
        Runtime.getRuntime().addShutdownHook(new Thread(() -> {
            for (ChildProcess child : LIVE) {
                child.kill();
            }
        }, "skerry-process-reaper"));
    }

    private ProcessLauncher() {
    }

    /** Whether children are tied to this JVM by the kernel (setpriv's parent-death signal). */
    public static boolean killedWithJvm() {
        return DEATH_SIGNAL_HELPER != null;
    }

    /** The number of children started and not yet ended (for tests). */
    public static int liveCount() {
        return LIVE.size();
    }

    static Process start(List<String> argv, Map<String, String> environment, Path folder, boolean mergeStderr)
            throws IOException {
        List<String> command = new ArrayList<>();
        if (DEATH_SIGNAL_HELPER != null) {
            command.addAll(List.of(DEATH_SIGNAL_HELPER, "--pdeathsig", "KILL", "--"));
        }
        command.addAll(GroupReaper.prefix());
        command.addAll(argv);
        ProcessBuilder builder = new ProcessBuilder(command).directory(folder.toFile());
        builder.environment().clear();
        builder.environment().putAll(environment);
        builder.redirectErrorStream(mergeStderr);
        // The group is listed with the reaper by the thread that started it, at once: handed back
        // to the caller first, a program under load could start its children before the listing
        // and outlive a SIGKILLed JVM (ProgramFaultTest caught it once in CI).
        Future<Process> started = THREAD.submit(() -> {
            Process process = builder.start();
            GroupReaper.started(process.pid());
            return process;
        });
        try {
            return started.get();
        } catch (ExecutionException e) {
            if (e.getCause() instanceof IOException) {
                throw (IOException) e.getCause();
            }
            throw new IllegalStateException("cannot start " + argv + ": " + e.getCause(), e.getCause());
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IOException("interrupted while starting " + argv, e);
        }
    }

    static void register(ChildProcess child) {
        LIVE.add(child);
    }

    static void unregister(ChildProcess child) {
        if (LIVE.remove(child)) {
            GroupReaper.ended(child.pid());
        }
    }

    /**
     * The executable {@code name} stands for: itself when it names a path (it must exist and be
     * executable), else the first executable of that name on {@code path} (a PATH value).
     *
     * @throws IOException naming the program and where it was looked for
     */
    public static Path resolveExecutable(String name, String path) throws IOException {
        if (name.isEmpty()) {
            throw new IOException("the command's program name is empty");
        }
        if (name.contains("/") || name.contains(File.separator)) {
            Path file = Path.of(name);
            if (!Files.isRegularFile(file)) {
                throw new IOException("program " + name + " does not exist");
            }
            if (!Files.isExecutable(file)) {
                throw new IOException("program " + name + " is not executable (chmod +x it, or name its interpreter "
                        + "first in the command)");
            }
            return file;
        }
        for (String folder : (path == null ? "" : path).split(File.pathSeparator)) {
            if (folder.isEmpty()) {
                continue;
            }
            Path candidate = Path.of(folder, name);
            if (Files.isRegularFile(candidate) && Files.isExecutable(candidate)) {
                return candidate;
            }
        }
        throw new IOException("program '" + name + "' is not on the PATH the program gets (" + path + ")");
    }

    private static String findDeathSignalHelper() {
        if (!System.getProperty("os.name", "").toLowerCase(java.util.Locale.ROOT).contains("linux")
                || Boolean.getBoolean("skerry.process.no-death-signal")) {
            return null;
        }
        for (String candidate : List.of("/usr/bin/setpriv", "/bin/setpriv", "/usr/sbin/setpriv")) {
            if (Files.isExecutable(Path.of(candidate)) && works(candidate)) {
                return candidate;
            }
        }
        return null;
    }

    /** Whether {@code setpriv} accepts the option (util-linux 2.33 and newer). */
    private static boolean works(String setpriv) {
        try {
            Process probe = new ProcessBuilder(setpriv, "--pdeathsig", "KILL", "--", "true")
                    .redirectErrorStream(true).redirectOutput(ProcessBuilder.Redirect.DISCARD).start();
            return probe.waitFor(10, java.util.concurrent.TimeUnit.SECONDS) && probe.exitValue() == 0;
        } catch (IOException e) {
            return false;
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            return false;
        }
    }
}
