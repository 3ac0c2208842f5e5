package org.skerry.checkpoint;

import java.io.ByteArrayInputStream;
import java.io.ByteArrayOutputStream;
import java.io.DataInputStream;
import java.io.DataOutputStream;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.SortedMap;
import java.util.TreeMap;
import org.skerry.engine.population.EvaluationTally;
import org.skerry.engine.sampler.IterationRecord;
import org.skerry.engine.sampler.PhaseTimes;
import org.skerry.engine.sampler.SamplerState;
import org.skerry.engine.sampler.ToleranceRecord;

/**
 * The byte form of the driver's part of a checkpoint: the settings that decide the answer (to
 * refuse a resume that would change it) and the {@link SamplerState}. Doubles are written as raw
 * IEEE-754 bits, so a resumed run continues from exactly the numbers the stopped one held.
 * A run without tolerances is written in format 1; an ABC run in format 2, which appends each
 * record's tolerance, share within it and simulations, and the target's state.
 */
public final class DriverStateCodec {

    /** "SKDS" in ASCII. */
    private static final int MAGIC = 0x534B4453;
    private static final int VERSION = 1;
    /** Format 1 followed by the ABC records and the target's state. */
    private static final int VERSION_TOLERANCES = 2;

    /** What the driver saved. */
    public record Saved(SortedMap<String, String> answerSettings, SamplerState state) {
    }

    private DriverStateCodec() {
    }

    public static byte[] encode(Map<String, String> answerSettings, SamplerState state) {
        ByteArrayOutputStream bytes = new ByteArrayOutputStream();
        try (DataOutputStream out = new DataOutputStream(bytes)) {
            boolean tolerances = state.targetState() != null;
            out.writeInt(MAGIC);
            out.writeInt(tolerances ? VERSION_TOLERANCES : VERSION);
            SortedMap<String, String> sorted = new TreeMap<>(answerSettings);
            out.writeInt(sorted.size());
            for (Map.Entry<String, String> e : sorted.entrySet()) {
                writeText(out, e.getKey());
                writeText(out, e.getValue());
            }
            out.writeInt(state.iteration());
            writeDouble(out, state.temperature());
            writeDouble(out, state.scale());
            writeDouble(out, state.logEvidence());
            writeDouble(out, state.logTotal());
            out.writeInt(state.resamplings());
            writeTally(out, state.evaluations());
            out.writeInt(state.records().size());
            for (IterationRecord r : state.records()) {
                writeRecord(out, r);
            }
            int[] sizes = state.islandSizes();
            out.writeInt(sizes == null ? -1 : sizes.length);
            if (sizes != null) {
                double[] evidence = state.islandLogEvidence();
                for (int i = 0; i < sizes.length; i++) {
                    out.writeInt(sizes[i]);
                    writeDouble(out, evidence[i]);
                }
            }
            out.writeBoolean(state.islandsIndependent());
            if (tolerances) {
                for (IterationRecord r : state.records()) {
                    ToleranceRecord abc = r.abc();
                    out.writeBoolean(abc != null);
                    if (abc != null) {
                        writeDouble(out, abc.tolerance());
                        writeDouble(out, abc.shareWithin());
                        out.writeLong(abc.simulations());
                    }
                }
                double[] target = state.targetState();
                out.writeInt(target.length);
                for (double value : target) {
                    writeDouble(out, value);
                }
            }
        } catch (IOException e) {
            throw new IllegalStateException("writing to memory cannot fail", e);
        }
        return bytes.toByteArray();
    }

    /** @throws IOException when the bytes are not a driver state of this format */
    public static Saved decode(byte[] bytes) throws IOException {
        DataInputStream in = new DataInputStream(new ByteArrayInputStream(bytes));
        if (in.readInt() != MAGIC) {
            throw new IOException("not a driver state file");
        }
        int version = in.readInt();
        if (version != VERSION && version != VERSION_TOLERANCES) {
            throw new IOException("driver state format version " + version + "; this build reads " + VERSION + " and "
                    + VERSION_TOLERANCES);
        }
        int settings = in.readInt();
        SortedMap<String, String> answer = new TreeMap<>();
        for (int i = 0; i < settings; i++) {
            answer.put(readText(in), readText(in));
        }
        int iteration = in.readInt();
        double temperature = readDouble(in);
        double scale = readDouble(in);
        double logEvidence = readDouble(in);
        double logTotal = readDouble(in);
        int resamplings = in.readInt();
        EvaluationTally tally = readTally(in);
        int count = in.readInt();
        if (count < 1 || count > 10_000_000) {
            throw new IOException("driver state with " + count + " iteration records");
        }
        List<IterationRecord> records = new ArrayList<>(count);
        for (int i = 0; i < count; i++) {
            records.add(readRecord(in));
        }
        int islands = in.readInt();
        int[] sizes = islands < 0 ? null : new int[islands];
        double[] evidence = islands < 0 ? null : new double[islands];
        for (int i = 0; i < islands; i++) {
            sizes[i] = in.readInt();
            evidence[i] = readDouble(in);
        }
        boolean independent = in.readBoolean();
        double[] target = null;
        if (version == VERSION_TOLERANCES) {
            for (int i = 0; i < count; i++) {
                if (in.readBoolean()) {
                    records.set(i, withTolerance(records.get(i),
                            new ToleranceRecord(readDouble(in), readDouble(in), in.readLong())));
                }
            }
            int length = in.readInt();
            if (length < 0 || length > 1_000_000) {
                throw new IOException("driver state with a target state of " + length + " values");
            }
            target = new double[length];
            for (int i = 0; i < length; i++) {
                target[i] = readDouble(in);
            }
        }
        try {
            return new Saved(answer, new SamplerState(iteration, temperature, scale, logEvidence, logTotal, resamplings,
                    tally, records, sizes, evidence, independent, target));
        } catch (IllegalArgumentException e) {
            throw new IOException("inconsistent driver state: " + e.getMessage(), e);
        }
    }

    private static void writeRecord(DataOutputStream out, IterationRecord r) throws IOException {
        out.writeInt(r.iteration());
        writeDouble(out, r.temperature());
        writeDouble(out, r.ess());
        out.writeBoolean(r.resampled());
        out.writeLong(r.distinctAncestors());
        out.writeLong(r.particlesMoved());
        writeDouble(out, r.acceptanceRate());
        out.writeInt(r.mhSteps());
        writeDouble(out, r.scale());
        writeDouble(out, r.logEvidenceIncrement());
        writeDouble(out, r.logEvidence());
        out.writeLong(r.evaluations());
        out.writeLong(r.zeroLikelihood());
        out.writeLong(r.invalidEvaluations());
        out.writeLong(r.firstInvalidIndex());
        writeText(out, r.firstInvalidReason());
        PhaseTimes t = r.seconds();
        double[] phases = {t.evaluate(), t.temperature(), t.reweight(), t.resample(), t.redistribute(), t.fit(),
            t.move(), t.checkpoint()};
        for (double phase : phases) {
            writeDouble(out, phase);
        }
        out.writeLong(r.retriedEvaluations());
        out.writeLong(r.failedAfterRetries());
        out.writeInt(r.firstInvalidParameters().size());
        for (double value : r.firstInvalidParameters()) {
            writeDouble(out, value);
        }
    }

    private static IterationRecord readRecord(DataInputStream in) throws IOException {
        int iteration = in.readInt();
        double temperature = readDouble(in);
        double ess = readDouble(in);
        boolean resampled = in.readBoolean();
        long ancestors = in.readLong();
        long moved = in.readLong();
        double acceptance = readDouble(in);
        int steps = in.readInt();
        double scale = readDouble(in);
        double increment = readDouble(in);
        double logEvidence = readDouble(in);
        long evaluations = in.readLong();
        long zero = in.readLong();
        long invalid = in.readLong();
        long firstInvalid = in.readLong();
        String reason = readText(in);
        PhaseTimes times = new PhaseTimes(readDouble(in), readDouble(in), readDouble(in), readDouble(in),
                readDouble(in), readDouble(in), readDouble(in), readDouble(in));
        long retried = in.readLong();
        long failedAfterRetries = in.readLong();
        int count = in.readInt();
        if (count < 0 || count > 1_000_000) {
            throw new IOException("iteration record with " + count + " parameter values");
        }
        List<Double> parameters = new ArrayList<>(count);
        for (int i = 0; i < count; i++) {
            parameters.add(readDouble(in));
        }
        return new IterationRecord(iteration, temperature, ess, resampled, ancestors, moved, acceptance, steps, scale,
                increment, logEvidence, evaluations, zero, invalid, firstInvalid, reason, times, retried,
                failedAfterRetries, parameters);
    }

    private static IterationRecord withTolerance(IterationRecord r, ToleranceRecord abc) {
        return new IterationRecord(r.iteration(), r.temperature(), r.ess(), r.resampled(), r.distinctAncestors(),
                r.particlesMoved(), r.acceptanceRate(), r.mhSteps(), r.scale(), r.logEvidenceIncrement(), r.logEvidence(),
                r.evaluations(), r.zeroLikelihood(), r.invalidEvaluations(), r.firstInvalidIndex(), r.firstInvalidReason(),
                r.seconds(), r.retriedEvaluations(), r.failedAfterRetries(), r.firstInvalidParameters(), abc);
    }

    private static void writeTally(DataOutputStream out, EvaluationTally t) throws IOException {
        out.writeLong(t.evaluations());
        out.writeLong(t.zeroLikelihood());
        out.writeLong(t.invalid());
        out.writeLong(t.firstInvalidIndex());
        writeText(out, t.firstInvalidReason());
        double[] parameters = t.firstInvalidParameters();
        out.writeInt(parameters == null ? -1 : parameters.length);
        if (parameters != null) {
            for (double p : parameters) {
                writeDouble(out, p);
            }
        }
        out.writeLong(t.retried());
        out.writeLong(t.failedAfterRetries());
    }

    private static EvaluationTally readTally(DataInputStream in) throws IOException {
        long evaluations = in.readLong();
        long zero = in.readLong();
        long invalid = in.readLong();
        long first = in.readLong();
        String reason = readText(in);
        int length = in.readInt();
        double[] parameters = length < 0 ? null : new double[length];
        for (int i = 0; i < length; i++) {
            parameters[i] = readDouble(in);
        }
        return new EvaluationTally(evaluations, zero, invalid, first, reason, parameters, in.readLong(), in.readLong());
    }

    private static void writeDouble(DataOutputStream out, double value) throws IOException {
        out.writeLong(Double.doubleToRawLongBits(value));
    }

    private static double readDouble(DataInputStream in) throws IOException {
        return Double.longBitsToDouble(in.readLong());
    }

    private static void writeText(DataOutputStream out, String text) throws IOException {
        if (text == null) {
            out.writeInt(-1);
            return;
        }
        byte[] utf8 = text.getBytes(StandardCharsets.UTF_8);
        out.writeInt(utf8.length);
        out.write(utf8);
    }

    private static String readText(DataInputStream in) throws IOException {
        int length = in.readInt();
        if (length < 0) {
            return null;
        }
        if (length > 1 << 24) {
            throw new IOException("text of " + length + " bytes in a driver state");
        }
        byte[] utf8 = new byte[length];
        in.readFully(utf8);
        return new String(utf8, StandardCharsets.UTF_8);
    }
}
