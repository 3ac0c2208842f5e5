package org.skerry.engine.program;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.skerry.engine.Slow;
import org.skerry.engine.model.LikelihoodContext;
import org.skerry.engine.model.prior.Normal;
import org.skerry.engine.random.RandomStream;
import org.skerry.engine.random.StreamPurpose;

/**
 * A program replying with summaries (reply kind summaries of the worker protocol): the same
 * summaries for the same seed, a reply with the wrong count an invalid simulation whose reason
 * names the counts, and a worker of the other kind refused at the start. Runs real Python
 * processes (test workers in src/test/resources/program).
 */
@Slow
class ProgramSimulatorTest {

    private static ProgramSettings settings(String script, List<String> summaries, String... arguments) {
        List<String> command = new ArrayList<>(List.of(PythonWorkers.PYTHON, PythonWorkers.SCRIPTS.resolve(script)
                .toString()));
        command.addAll(List.of(arguments));
        return new ProgramSettings(command, List.of(), PythonWorkers.environment(), Duration.ofSeconds(30),
                Duration.ofSeconds(60), ProgramSettings.Mode.WORKER, 1, List.of("mu"), List.of(Normal.of(0, 3)), null,
                null, summaries);
    }

    private static LikelihoodContext context(long particle) {
        RandomStream random = new RandomStream(17, StreamPurpose.TESTING, 2, particle);
        return new LikelihoodContext() {
            @Override
            public RandomStream random() {
                return random;
            }

            @Override
            public long particleIndex() {
                return particle;
            }

            @Override
            public int iteration() {
                return 2;
            }
        };
    }

    @Test
    @DisplayName("the same seed gives the same summaries (a fresh worker, another order); another seed others")
    void seededSummaries() {
        double[] first = new double[1];
        double[] again = new double[1];
        double[] other = new double[1];
        try (ProgramSimulator simulator = new ProgramSimulator(settings("normal_mean_summaries.py", List.of("mean"),
                "10", "1.0"))) {
            assertEquals(List.of("mean"), simulator.summaryNames());
            simulator.simulate(new double[] {1.5}, context(4), first);
            simulator.simulate(new double[] {1.5}, context(5), other);
        }
        try (ProgramSimulator simulator = new ProgramSimulator(settings("normal_mean_summaries.py", List.of("mean"),
                "10", "1.0"))) {
            simulator.simulate(new double[] {1.5}, context(4), again);
        }
        assertArrayEquals(first, again, "bit for bit, from the seed alone");
        assertTrue(first[0] != other[0], "another particle, another seed");
        // The mean of 10 draws of N(1.5, 1) lies within 6 of its sds (0.32) of 1.5 but in 1e-9 of cases.
        assertEquals(1.5, first[0], 6 / Math.sqrt(10));
    }

    @Test
    @DisplayName("simulateAll in requests of 4 (the worker's batched form), M = 2: each vector's summaries are its two "
            + "single calls' on its own stream, bit for bit")
    void batchedMatchesSingles() {
        int count = 5;
        double[] parameters = {1.5, -0.5, 2.0, 0.0, 3.25};
        double[] batched = new double[count * 2];
        String[] errors = new String[count];
        org.skerry.engine.model.BatchContext context = new org.skerry.engine.model.BatchContext() {
            @Override
            public int iteration() {
                return 2;
            }

            @Override
            public long particleIndex(int i) {
                return 10 + i;
            }

            @Override
            public RandomStream random(int i) {
                return new RandomStream(17, StreamPurpose.TESTING, 2, 10 + i);
            }
        };
        ProgramSettings four = settings("normal_mean_summaries.py", List.of("mean"), "10", "1.0", "--batched");
        four = new ProgramSettings(four.command(), four.files(), four.environment(), four.timeout(),
                four.startTimeout(), four.mode(), 4, four.names(), four.priors(), four.scratch(), four.fileMode(),
                four.summaries());
        try (ProgramSimulator simulator = new ProgramSimulator(four)) {
            simulator.simulateAll(parameters, count, 2, context, batched, errors);
        }
        try (ProgramSimulator simulator = new ProgramSimulator(settings("normal_mean_summaries.py", List.of("mean"),
                "10", "1.0"))) {
            for (int i = 0; i < count; i++) {
                assertEquals(null, errors[i], "vector " + i);
                LikelihoodContext single = context(10 + i);
                double[] one = new double[1];
                for (int m = 0; m < 2; m++) {
                    simulator.simulate(new double[] {parameters[i]}, single, one);
                    assertEquals(Double.doubleToRawLongBits(one[0]), Double.doubleToRawLongBits(batched[i * 2 + m]),
                            "vector " + i + ", simulation " + m);
                }
            }
        }
    }

    @Test
    @DisplayName("a reply with two numbers for one summary: an invalid simulation naming the counts; the worker "
            + "goes on")
    void wrongCount() {
        try (ProgramSimulator simulator = new ProgramSimulator(settings("normal_mean_summaries.py", List.of("mean"),
                "10", "1.0", "--wrong-count"))) {
            for (int k = 0; k < 2; k++) {
                ProgramFailureException e = assertThrows(ProgramFailureException.class,
                        () -> simulator.simulate(new double[] {1.5}, context(4), new double[1]));
                assertTrue(e.getMessage().contains("carried 2 numbers")
                        && e.getMessage().contains("model.program.summaries names 1 [mean]"), e.getMessage());
            }
            assertEquals(1, simulator.workersStarted(), "a wrong count does not cost the worker");
        }
    }

    @Test
    @DisplayName("the Python library refuses a summaries function returning the wrong count, as an error reply")
    void libraryWrongCount() {
        try (ProgramSimulator simulator = new ProgramSimulator(settings("normal_mean_summaries.py", List.of("mean"),
                "10", "1.0", "--two"))) {
            ProgramFailureException e = assertThrows(ProgramFailureException.class,
                    () -> simulator.simulate(new double[] {1.5}, context(4), new double[1]));
            assertTrue(e.getMessage().contains("returned 2 numbers for 1 summaries"), e.getMessage());
        }
    }

    @Test
    @DisplayName("a log-likelihood worker asked for summaries, and a summaries worker asked for a log-likelihood: "
            + "refused at the start, naming the key")
    void otherKindRefused() {
        try (ProgramSimulator simulator = new ProgramSimulator(settings("faulty.py", List.of("mean"), "error"))) {
            ProgramStartException e = assertThrows(ProgramStartException.class, simulator::probe);
            assertTrue(e.getMessage().contains("model.program.summaries = mean"), e.getMessage());
        }
        try (ProgramModel model = new ProgramModel(settings("normal_mean_summaries.py", List.of(), "10", "1.0"))) {
            ProgramStartException e = assertThrows(ProgramStartException.class, model::probe);
            assertTrue(e.getMessage().contains("name the summaries in model.program.summaries"), e.getMessage());
        }
    }
}
