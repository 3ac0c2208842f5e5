package org.skerry.engine.process;

import java.io.IOException;
import java.io.OutputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;

/**
 * Kills, once this JVM is gone, what its programs started: the children of a wrapper script or of
 * a file-mode program, which the kernel's parent-death signal (it reaches the program only) does
 * not reach. Each program is started in a session and process group of its own (util-linux's
 * {@code setsid}, which then does not fork, so the program keeps the process id the JVM sees);
 * one small shell process per JVM, in a session of its own so that a signal to the JVM's process
 * group does not reach it, reads the groups' ids from a pipe and, when the pipe ends — the JVM has
 * exited or was killed, even with SIGKILL — kills every group still listed. When a program ends,
 * its group is killed (a stray background process of an evaluation goes with it) and forgotten,
 * so an id is never held long enough to be reused by an unrelated process.
 *
 * <p>Where {@code setsid} or {@code /bin/sh} is missing, programs start in the JVM's group as
 * before and this layer is absent.
 */
final class GroupReaper {

    /**
     * The reaper's fixed script: it runs no user program, and every id it reads is checked to be
     * digits before use. "+ID" lists a group, "-ID" kills and forgets one; at the end of input,
     * every group still listed is killed.
     */
    private static final String SCRIPT = String.join("\n",
            "groups=' '",
            "while read -r line; do",
            "  id=${line#?}",
            "  case $id in ''|*[!0-9]*) continue ;; esac",
            "  case $line in",
            "    +*) groups=\"$groups$id \" ;;",
            "    -*) kill -KILL \"-$id\" 2>/dev/null",
            "        case $groups in *\" $id \"*) groups=\"${groups%% $id *} ${groups#* $id }\" ;; esac ;;",
            "  esac",
            "done",
            "for id in $groups; do kill -KILL \"-$id\" 2>/dev/null; done",
            "");

    private static final String SETSID = find("setsid");
    private static final String SHELL = Files.isExecutable(Path.of("/bin/sh")) ? "/bin/sh" : null;

    private static Process reaper;
    private static OutputStream pipe;
    private static boolean failed;

    private GroupReaper() {
    }

    /**
     * What goes before a program's argument list so that it leads a group of its own ({@code
     * setsid}), or nothing where this layer is absent; starts the reaper on first use.
     */
    static synchronized List<String> prefix() {
        if (SETSID == null || SHELL == null || failed || Boolean.getBoolean("skerry.process.no-group-reaper")) {
            return List.of();
        }
        if (reaper == null) {
            try {
                // Started directly, not by the launcher thread: it must outlive this JVM, so no
                // parent-death signal, and setsid keeps signals for the JVM's group away from it.
                reaper = new ProcessBuilder(SETSID, SHELL, "-c", SCRIPT, "skerry-group-reaper")
                        .redirectOutput(ProcessBuilder.Redirect.DISCARD)
                        .redirectError(ProcessBuilder.Redirect.DISCARD).start();
                pipe = reaper.getOutputStream();
            } catch (IOException e) {
                failed = true;
                return List.of();
            }
        }
        return List.of(SETSID);
    }

    /** Lists the group that program {@code pid} leads (started with {@link #prefix}). */
    static void started(long pid) {
        send("+" + pid + "\n");
    }

    /** Kills what is left of the group program {@code pid} led, and forgets it. */
    static void ended(long pid) {
        send("-" + pid + "\n");
    }

    private static synchronized void send(String line) {
        if (pipe == null) {
            return;
        }
        try {
            pipe.write(line.getBytes(StandardCharsets.US_ASCII));
            pipe.flush();
        } catch (IOException e) {
            // The reaper has gone (someone killed it): programs are still killed with the JVM's
            // process tree on an orderly exit, and by the parent-death signal.
            pipe = null;
            failed = true;
        }
    }

    private static String find(String name) {
        if (!System.getProperty("os.name", "").toLowerCase(java.util.Locale.ROOT).contains("linux")) {
            return null;
        }
        for (String folder : List.of("/usr/bin", "/bin", "/usr/sbin", "/sbin")) {
            Path candidate = Path.of(folder, name);
            if (Files.isExecutable(candidate)) {
                return candidate.toString();
            }
        }
        return null;
    }
}
