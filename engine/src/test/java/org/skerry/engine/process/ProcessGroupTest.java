package org.skerry.engine.process;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.condition.EnabledOnOs;
import org.junit.jupiter.api.condition.OS;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.engine.Slow;
import org.skerry.engine.program.PythonWorkers;

/**
 * Every program leads a process group of its own, and what is left of the group when the program
 * ends is killed ({@link GroupReaper}): a wrapper script's background child does not outlive it.
 * (That the groups are also killed when the JVM is killed with SIGKILL is ProgramFaultTest's.)
 */
@Slow
@EnabledOnOs(OS.LINUX)
class ProcessGroupTest {

    @TempDir
    Path folder;

    @BeforeEach
    void needsSetsid() {
        org.junit.jupiter.api.Assumptions.assumeTrue(
                Files.isExecutable(Path.of("/usr/bin/setsid")) || Files.isExecutable(Path.of("/bin/setsid")),
                "util-linux's setsid is installed");
    }

    private static String stat(long pid) {
        try {
            String stat = Files.readString(Path.of("/proc", Long.toString(pid), "stat"));
            return stat.substring(stat.lastIndexOf(')') + 2);
        } catch (IOException e) {
            return null;
        }
    }

    /** Gone: no such process, or a zombie (exited; its new parent has not collected it yet). */
    private static boolean gone(long pid) {
        String stat = stat(pid);
        return stat == null || stat.startsWith("Z");
    }

    private static boolean pause() {
        try {
            Thread.sleep(10);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
        return true;
    }

    @Test
    @DisplayName("a program leads a process group of its own (its group id is its process id, which the JVM sees)")
    void programLeadsItsGroup() throws IOException {
        try (ChildProcess child = ChildProcess.start(List.of("sleep", "30"), ChildEnvironment.of(Map.of(), folder),
                folder, false)) {
            // The JVM sees the process as soon as setpriv runs; setsid comes two execs later.
            long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(5);
            String group;
            do {
                String stat = stat(child.pid());
                assertNotNull(stat, "the program runs");
                group = stat.split(" ")[2]; // after ")": state, ppid, pgrp (proc(5))
            } while (!group.equals(Long.toString(child.pid())) && System.nanoTime() < deadline && pause());
            assertEquals(Long.toString(child.pid()), group, "process group of " + child.label());
            assertTrue(child.isAlive(), "the same process: setsid did not fork");
        }
    }

    @Test
    @DisplayName("a program that exits leaving a background child: the child is killed with the group within 10 s")
    void strayChildGoesWithTheProgram() throws Exception {
        Path pidFile = folder.resolve("child.pid");
        long strayPid;
        try (ChildProcess child = ChildProcess.start(List.of("sh",
                PythonWorkers.SCRIPTS.resolve("leaves_child.sh").toString(), pidFile.toString()),
                ChildEnvironment.of(Map.of(), folder), folder, false)) {
            assertEquals(0, child.waitFor(30_000), "the program exited by itself: " + child.stderrTail());
            long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(10);
            while (!Files.exists(pidFile)) {
                assertTrue(System.nanoTime() < deadline, "no pid file");
                Thread.sleep(10);
            }
            strayPid = Long.parseLong(Files.readString(pidFile).strip());
            try {
                while (!gone(strayPid)) {
                    assertTrue(System.nanoTime() < deadline, "the background child " + strayPid
                            + " outlived its program by 10 s");
                    Thread.sleep(20);
                }
            } finally {
                ProcessHandle.of(strayPid).ifPresent(ProcessHandle::destroyForcibly);
            }
        }
    }
}
