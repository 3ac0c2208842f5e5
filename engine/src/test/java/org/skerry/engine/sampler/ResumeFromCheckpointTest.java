package org.skerry.engine.sampler;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayInputStream;
import java.io.ByteArrayOutputStream;
import java.io.DataInputStream;
import java.io.DataOutputStream;
import java.io.IOException;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.ModelSource;
import org.skerry.engine.particle.ParticleBlock;
import org.skerry.engine.particle.ParticleBlockCodec;
import org.skerry.engine.population.BlockStore;
import org.skerry.engine.population.Population;
import org.skerry.engine.temper.TemperedTarget;
import org.skerry.engine.population.StoredBlock;
import org.skerry.engine.population.threads.ThreadPoolBackend;

/**
 * A run continued from any of its checkpoints — on another thread count and block size — ends
 * bit for bit where the undisturbed run ends (the invariant "same seed, same answer" of the
 * design notes, extended to resumed runs).
 */
class ResumeFromCheckpointTest {

    /** Blocks kept as bytes in memory, one map per checkpoint. */
    static final class MemoryBlockStore implements BlockStore {
        private static final long serialVersionUID = 1L;
        final Map<String, byte[]> files = new ConcurrentHashMap<>();

        @Override
        public StoredBlock write(int block, ParticleBlock particles) throws IOException {
            ByteArrayOutputStream bytes = new ByteArrayOutputStream();
            ParticleBlockCodec.write(particles, new DataOutputStream(bytes));
            String name = "block-" + block;
            files.put(name, bytes.toByteArray());
            return new StoredBlock(block, name, bytes.size(), 0, particles.size());
        }

        @Override
        public ParticleBlock read(StoredBlock stored) throws IOException {
            byte[] bytes = files.get(stored.fileName());
            if (bytes == null) {
                throw new IOException(stored.fileName() + " is missing from memory");
            }
            return ParticleBlockCodec.read(new DataInputStream(new ByteArrayInputStream(bytes)));
        }

        @Override
        public String location() {
            return "memory";
        }
    }

    /** Saved state and blocks of one iteration. */
    record Saved(SamplerState state, MemoryBlockStore store, List<StoredBlock> blocks) {
        SamplerState restoreInto(Population population) {
            List<String> problems = population.readBlocks(store, blocks);
            if (!problems.isEmpty()) {
                throw new IllegalStateException(problems.toString());
            }
            return state;
        }
    }

    /** Checkpoints every iteration into memory. */
    static class MemoryCheckpointer implements Checkpointer {
        final List<Saved> saved = new ArrayList<>();

        @Override
        public boolean due(int iteration) {
            return true;
        }

        @Override
        public void write(SamplerState state, Population population) {
            MemoryBlockStore store = new MemoryBlockStore();
            saved.add(new Saved(state, store, population.writeBlocks(store)));
        }
    }

    private static SamplerSettings settings(int islands) {
        return SamplerSettings.builder().particles(240).seed(31).islands(islands).build();
    }

    private static void assertSameRun(SamplerResult expected, SamplerResult actual, String where) {
        assertEquals(SameSeedSameAnswerTest.fingerprint(expected), SameSeedSameAnswerTest.fingerprint(actual), where);
        assertArrayEquals(expected.particles().values(), actual.particles().values(), where);
        assertArrayEquals(expected.particles().eve(), actual.particles().eve(), where);
        assertArrayEquals(expected.normalisedWeights(), actual.normalisedWeights(), where);
        assertEquals(expected.evaluations().evaluations(), actual.evaluations().evaluations(), where);
    }

    private static void resumeFromEvery(SamplerSettings settings) {
        resumeFromEvery(settings, SameSeedSameAnswerTest.model());
    }

    static void resumeFromEvery(SamplerSettings settings, Model model) {
        MemoryCheckpointer checkpoints = new MemoryCheckpointer();
        SamplerResult undisturbed;
        try (ThreadPoolBackend backend = new ThreadPoolBackend(2, 0)) {
            undisturbed = new SmcSampler(settings).run(ModelSource.local(model), backend,
                    IterationListener.NONE, checkpoints, StopCondition.NEVER);
        }
        assertEquals(undisturbed.iterations().size(), checkpoints.saved.size(), "a checkpoint after every iteration");
        assertTrue(checkpoints.saved.size() >= 4, "enough iterations to test: " + checkpoints.saved.size());
        for (Saved saved : checkpoints.saved) {
            try (ThreadPoolBackend other = new ThreadPoolBackend(3, 17)) {
                SamplerResult resumed = new SmcSampler(settings).resume(
                        ModelSource.local(model), other, IterationListener.NONE,
                        Checkpointer.NONE, StopCondition.NEVER, saved::restoreInto);
                assertSameRun(undisturbed, resumed, "resumed after iteration " + saved.state().iteration());
            }
        }
    }

    @Test
    @DisplayName("resumed from any iteration's checkpoint, on other threads and blocks: bit-identical results")
    void globalMode() {
        resumeFromEvery(settings(0));
    }

    @Test
    @DisplayName("island mode resumes bit-identically too, island evidences included")
    void islandMode() {
        resumeFromEvery(settings(6));
    }

    @Test
    @DisplayName("a stop request checkpoints the last completed iteration and throws; resuming finishes the run")
    void stopAndResume() {
        SamplerSettings settings = settings(0);
        SamplerResult undisturbed;
        try (ThreadPoolBackend backend = new ThreadPoolBackend(2, 0)) {
            undisturbed = new SmcSampler(settings).run(SameSeedSameAnswerTest.model(), backend);
        }
        // Due only at iteration 0, so the stop itself must write the checkpoint of iteration 3.
        MemoryCheckpointer sparse = new MemoryCheckpointer() {
            @Override
            public boolean due(int iteration) {
                return iteration == 0;
            }
        };
        StopCondition afterThree = (state, predicted) -> state.iteration() == 3 ? "asked to stop" : null;
        RunStoppedException stopped;
        try (ThreadPoolBackend backend = new ThreadPoolBackend(2, 0)) {
            stopped = assertThrows(RunStoppedException.class, () -> new SmcSampler(settings).run(
                    ModelSource.local(SameSeedSameAnswerTest.model()), backend, IterationListener.NONE, sparse,
                    afterThree));
        }
        assertEquals(3, stopped.iteration());
        assertEquals(List.of(0, 3), sparse.saved.stream().map(s -> s.state().iteration()).toList());
        Saved last = sparse.saved.get(1);
        try (ThreadPoolBackend backend = new ThreadPoolBackend(1, 0)) {
            SamplerResult resumed = new SmcSampler(settings).resume(ModelSource.local(SameSeedSameAnswerTest.model()),
                    backend, IterationListener.NONE, Checkpointer.NONE, StopCondition.NEVER, last::restoreInto);
            assertSameRun(undisturbed, resumed, "resumed after a stop");
        }
    }

    @Test
    @DisplayName("a damaged block is reported by file name and leaves the population as it was")
    void damagedBlock() {
        MemoryCheckpointer checkpoints = new MemoryCheckpointer();
        try (ThreadPoolBackend backend = new ThreadPoolBackend(2, 0)) {
            new SmcSampler(settings(0)).run(ModelSource.local(SameSeedSameAnswerTest.model()), backend,
                    IterationListener.NONE, checkpoints, StopCondition.NEVER);
        }
        Saved saved = checkpoints.saved.get(2);
        byte[] bytes = saved.store().files.get("block-1");
        bytes[bytes.length / 2] ^= 0x40;
        saved.store().files.remove("block-0");
        try (ThreadPoolBackend backend = new ThreadPoolBackend(2, 0);
                Population population = new Population(
                        backend.open(ModelSource.local(SameSeedSameAnswerTest.model()), 240, 0), 240,
                        SameSeedSameAnswerTest.model().dimension(), 31, 0)) {
            population.initialise(null, new TemperedTarget(0.0));
            double[] before = population.temperingInputs().logWeight();
            List<String> problems = population.readBlocks(saved.store(), saved.blocks());
            assertTrue(problems.stream().anyMatch(p -> p.contains("block-0")), problems.toString());
            assertArrayEquals(before, population.temperingInputs().logWeight());
            assertNotEquals(List.of(), problems);
        }
    }
}
