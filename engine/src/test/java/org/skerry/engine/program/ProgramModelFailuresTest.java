package org.skerry.engine.program;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.List;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.TimeUnit;
import java.util.stream.Stream;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.engine.Slow;
import org.skerry.engine.population.EvaluationTally;
import org.skerry.engine.population.block.LikelihoodEvaluator;

/**
 * Every way a worker program can fail, each with its documented outcome: an invalid evaluation
 * whose reason says what happened and ends with the program's standard error, a fresh worker for
 * the next evaluation, retries as set; and a program that cannot start at all refused before a
 * run with its standard error. Runs real Python processes (test workers in src/test/resources/program).
 */
@Slow
class ProgramModelFailuresTest {

    @TempDir
    Path scratch;

    private ProgramModel model(String behaviour, Duration timeout, String... more) {
        String[] arguments = new String[more.length + 1];
        arguments[0] = behaviour;
        System.arraycopy(more, 0, arguments, 1, more.length);
        return new ProgramModel(PythonWorkers.settings("faulty.py", List.of(), timeout, 1, scratch, arguments));
    }

    /** One evaluation at mu = 1.5 through the sampler's evaluator, with {@code retries}. */
    private static EvaluationTally evaluate(ProgramModel model, int retries, double[] value) {
        LikelihoodEvaluator evaluator = new LikelihoodEvaluator(model, 11L, retries);
        value[0] = evaluator.evaluate(new double[] {1.5}, 3, 2, 1);
        return evaluator.drainTally();
    }

    private static String invalidReason(ProgramModel model) {
        double[] value = new double[1];
        EvaluationTally tally = evaluate(model, 0, value);
        assertEquals(Double.NEGATIVE_INFINITY, value[0]);
        assertEquals(1, tally.invalid(), "one invalid evaluation");
        return tally.firstInvalidReason();
    }

    private static void assertHas(String text, String... fragments) {
        for (String fragment : fragments) {
            assertTrue(text.contains(fragment), "'" + fragment + "' in: " + text);
        }
    }

    @Test
    @DisplayName("an error reply: invalid, with the program's error text as the reason; the worker goes on")
    void errorReply() {
        try (ProgramModel model = model("error", Duration.ofSeconds(30))) {
            assertHas(invalidReason(model), "reported an error", "ValueError: the solver diverged at mu=1.5");
            invalidReason(model);
            assertEquals(1, model.workersStarted(), "an error reply does not cost the worker");
        }
    }

    @Test
    @DisplayName("a worker that exits mid-evaluation: invalid, exit status and stderr tail in the reason; restarted")
    void exit() {
        try (ProgramModel model = model("exit", Duration.ofSeconds(30))) {
            assertHas(invalidReason(model), "exited with status 3", "giving up on mu=1.5");
            invalidReason(model);
            assertEquals(2, model.workersStarted(), "a fresh worker for the next evaluation");
        }
    }

    @Test
    @DisplayName("a crash (SIGSEGV): invalid, the signal and stderr tail in the reason")
    void crash() {
        try (ProgramModel model = model("crash", Duration.ofSeconds(30))) {
            assertHas(invalidReason(model), "killed by signal 11", "about to crash");
        }
    }

    @Test
    @DisplayName("a reply that is not a number: invalid, the reply quoted")
    void notANumber() {
        try (ProgramModel model = model("garbage", Duration.ofSeconds(30))) {
            assertHas(invalidReason(model), "'value not-a-number', which is not a number");
        }
    }

    @Test
    @DisplayName("a reply to another request: invalid, what came and what was expected; the worker is replaced")
    void mismatchedReply() {
        try (ProgramModel model = model("mismatch", Duration.ofSeconds(30))) {
            assertHas(invalidReason(model), "its reply began 'result 999 1', not 'result 1 1'");
            invalidReason(model);
            assertEquals(2, model.workersStarted());
        }
    }

    @Test
    @DisplayName("a hung worker: invalid after the timeout, the whole process tree (the worker and its child) killed")
    void timeoutKillsTheTree() throws IOException, InterruptedException {
        Path pids = Files.createDirectories(scratch.resolve("pids"));
        try (ProgramModel model = model("hang", Duration.ofSeconds(2), pids.toString())) {
            long started = System.nanoTime();
            assertHas(invalidReason(model), "no reply within 2 s (the timeout); its process tree was killed",
                    "faulty worker starting: hang");
            assertTrue(System.nanoTime() - started < TimeUnit.SECONDS.toNanos(20), "the run does not hang");
            List<Path> files;
            try (Stream<Path> listed = Files.list(pids)) {
                files = listed.toList();
            }
            assertEquals(1, files.size());
            for (String pid : Files.readString(files.get(0)).strip().split(" ")) {
                assertGone(Long.parseLong(pid));
            }
        }
    }

    @Test
    @DisplayName("a worker killed (SIGKILL) in the middle of an evaluation: invalid, said so; the next evaluation gets a new worker")
    void killedMidEvaluation() throws Exception {
        Path folder = Files.createDirectories(scratch.resolve("busy"));
        Files.writeString(folder.resolve("go"), "");
        try (ProgramModel model = model("busy", Duration.ofSeconds(120), folder.toString())) {
            double[] value = new double[1];
            CompletableFuture<EvaluationTally> evaluation = CompletableFuture.supplyAsync(() -> evaluate(model, 0, value));
            Path busy = awaitFile(folder, "busy-");
            Files.delete(folder.resolve("go"));
            long pid = Long.parseLong(Files.readString(busy).strip());
            ProcessHandle.of(pid).ifPresent(ProcessHandle::destroyForcibly);
            EvaluationTally tally = evaluation.get(60, TimeUnit.SECONDS);
            assertEquals(1, tally.invalid());
            assertHas(tally.firstInvalidReason(), "killed by signal 9");
            EvaluationTally next = evaluate(model, 0, value);
            assertEquals(0, next.invalid(), String.valueOf(next.firstInvalidReason()));
            assertEquals(-0.5 * 1.5 * 1.5, value[0]);
            assertEquals(2, model.workersStarted());
        }
    }

    @Test
    @DisplayName("model.retries applies: a one-off failure is invalid without retries and retried to the right value with one")
    void retries() throws IOException {
        Path marker = scratch.resolve("fail-once");
        try (ProgramModel model = model("fail-once", Duration.ofSeconds(30), marker.toString())) {
            Files.writeString(marker, "");
            assertHas(invalidReason(model), "exited with status 4", "failing once");
            Files.writeString(marker, "");
            double[] value = new double[1];
            EvaluationTally tally = evaluate(model, 1, value);
            assertEquals(0, tally.invalid());
            assertEquals(1, tally.retried(), "one retried evaluation");
            assertEquals(-0.5 * 1.5 * 1.5, value[0], "the retry's value is the healthy one");
        }
    }

    @Test
    @DisplayName("programs that cannot start are refused before a run, with their standard error: missing interpreter, "
            + "import error, exit without a word, another protocol version, a banner on standard output")
    void cannotStart() {
        ProgramSettings missing = new ProgramSettings(List.of("python-that-is-not-installed", "x.py"), List.of(),
                PythonWorkers.environment(), Duration.ofSeconds(5), Duration.ofSeconds(30), ProgramSettings.Mode.WORKER,
                1, List.of("mu"), List.of(org.skerry.engine.model.prior.Normal.of(0, 1)), scratch, null);
        assertHas(assertThrows(ProgramStartException.class, () -> new ProgramModel(missing).probe()).getMessage(),
                "program 'python-that-is-not-installed' is not on the PATH");
        assertHas(startFailure("import-error"), "exited with status 1 before saying it was ready",
                "ModuleNotFoundError", "a_module_that_is_not_installed");
        assertHas(startFailure("silent"), "exited with status 5", "faulty worker starting: silent");
        assertHas(startFailure("version"), "it speaks protocol version 2; this skerry speaks version 1");
        assertHas(startFailure("chatty"), "its first line was 'Welcome to the simulator 1.0'", "standard error");
        try (Stream<Path> left = Files.list(scratch)) {
            assertEquals(0, left.count(), "no scratch folder left behind");
        } catch (IOException e) {
            throw new AssertionError(e);
        }
    }

    private String startFailure(String behaviour) {
        try (ProgramModel model = model(behaviour, Duration.ofSeconds(30))) {
            return assertThrows(ProgramStartException.class, model::probe).getMessage();
        }
    }

    @Test
    @DisplayName("close ends every worker and removes the scratch folders; a worker given no input exits")
    void closeEndsWorkers() throws IOException {
        ProgramModel model = model("healthy", Duration.ofSeconds(30));
        double[] value = new double[1];
        evaluate(model, 0, value);
        assertEquals(-0.5 * 1.5 * 1.5, value[0]);
        List<ProcessHandle> workers = ProcessHandle.current().children()
                .filter(p -> p.info().commandLine().orElse("").contains("faulty.py")).toList();
        assertEquals(1, workers.size(), "one worker for one thread");
        model.close();
        for (ProcessHandle worker : workers) {
            assertGone(worker.pid());
        }
        try (Stream<Path> left = Files.list(scratch)) {
            assertEquals(0, left.count(), "scratch removed");
        }
    }

    private static Path awaitFile(Path folder, String prefix) throws IOException, InterruptedException {
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(60);
        while (System.nanoTime() < deadline) {
            try (Stream<Path> listed = Files.list(folder)) {
                var found = listed.filter(p -> p.getFileName().toString().startsWith(prefix)).findFirst();
                if (found.isPresent() && Files.size(found.get()) > 0) {
                    return found.get();
                }
            }
            Thread.sleep(20);
        }
        throw new AssertionError("no " + prefix + " file in " + folder + " within 60 s");
    }

    static void assertGone(long pid) {
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(10);
        while (ProcessHandle.of(pid).map(ProcessHandle::isAlive).orElse(false)) {
            assertTrue(System.nanoTime() < deadline, "process " + pid + " still alive");
            try {
                Thread.sleep(20);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                return;
            }
        }
        assertFalse(ProcessHandle.of(pid).map(ProcessHandle::isAlive).orElse(false));
    }
}
