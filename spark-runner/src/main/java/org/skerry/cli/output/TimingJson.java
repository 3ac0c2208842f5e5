package org.skerry.cli.output;

import com.fasterxml.jackson.core.JsonGenerator;
import java.io.IOException;
import java.nio.file.Path;
import java.time.format.DateTimeFormatter;
import java.util.List;
import org.skerry.engine.sampler.IterationRecord;
import org.skerry.engine.sampler.PhaseTimes;

/**
 * Writes {@code timing.json}: how long a run took and where it ran, kept apart from
 * {@code summary.json} because none of it is determined by the seed.
 *
 * <p>Keys, in this order: {@code wall_seconds}; {@code stage_seconds}, an object holding
 * {@code startup, sampling, export, output} (see {@link Stages}); {@code phase_seconds}, an object holding
 * {@code evaluate, temperature, reweight, resample, redistribute, fit, move, checkpoint}, each summed
 * over all iterations;
 * {@code program_version}, {@code java_version}, {@code java_vendor}, {@code host}, {@code backend}
 * (null where unknown); {@code started_at}, ISO-8601 in UTC ({@code 2025-03-01T09:30:00.250Z}).
 */
public final class TimingJson {

    /** The file's name in the run folder. */
    public static final String FILE_NAME = "timing.json";

    private TimingJson() {
    }

    /**
     * Where a run's wall time went: opening the backend (a Spark context) and checking the
     * checkpoint folder; the sampling iterations; fetching the final population and computing its
     * summaries; writing {@code particles.csv} and {@code iterations.csv}. The population streams
     * into {@code particles.csv} during the export, so the two interleave: the seconds spent inside
     * the file writers count as {@code output}, the rest of the export as {@code export}.
     * {@code wall} runs from the start to the end of the export; it holds startup, sampling,
     * export and the streamed part of output, and the rest of output (publishing the file,
     * {@code iterations.csv}) follows it. {@code summary.json} and the report are written after
     * this file, so no figure here counts them.
     */
    public record Stages(double wall, double startup, double sampling, double export, double output) {
    }

    /**
     * Writes {@code timing.json} in {@code folder}, atomically.
     *
     * @param folder      an existing folder
     * @param environment where and when the run happened
     * @param seconds     wall-clock seconds of the whole run and of its stages
     * @param iterations  the run's iteration records (their phase times are summed); records
     *                    without phase times count as zero
     * @return the file written
     */
    public static Path write(Path folder, RunEnvironment environment, Stages seconds,
            List<IterationRecord> iterations) throws IOException {
        if (folder == null) {
            throw new IllegalArgumentException("folder must not be null");
        }
        if (environment == null) {
            throw new IllegalArgumentException("environment must not be null");
        }
        if (seconds == null) {
            throw new IllegalArgumentException("seconds must not be null");
        }
        if (iterations == null) {
            throw new IllegalArgumentException("iterations must not be null");
        }
        double[] sums = new double[8];
        for (IterationRecord record : iterations) {
            PhaseTimes t = record.seconds();
            if (t != null) {
                sums[0] += t.evaluate();
                sums[1] += t.temperature();
                sums[2] += t.reweight();
                sums[3] += t.resample();
                sums[4] += t.redistribute();
                sums[5] += t.fit();
                sums[6] += t.move();
                sums[7] += t.checkpoint();
            }
        }
        Path file = folder.resolve(FILE_NAME);
        AtomicFile.write(file, out -> {
            JsonGenerator json = JsonOutput.open(out);
            json.writeStartObject();
            JsonOutput.number(json, "wall_seconds", seconds.wall());
            json.writeObjectFieldStart("stage_seconds");
            JsonOutput.number(json, "startup", seconds.startup());
            JsonOutput.number(json, "sampling", seconds.sampling());
            JsonOutput.number(json, "export", seconds.export());
            JsonOutput.number(json, "output", seconds.output());
            json.writeEndObject();
            json.writeObjectFieldStart("phase_seconds");
            JsonOutput.number(json, "evaluate", sums[0]);
            JsonOutput.number(json, "temperature", sums[1]);
            JsonOutput.number(json, "reweight", sums[2]);
            JsonOutput.number(json, "resample", sums[3]);
            JsonOutput.number(json, "redistribute", sums[4]);
            JsonOutput.number(json, "fit", sums[5]);
            JsonOutput.number(json, "move", sums[6]);
            JsonOutput.number(json, "checkpoint", sums[7]);
            json.writeEndObject();
            JsonOutput.text(json, "program_version", environment.programVersion());
            JsonOutput.text(json, "java_version", environment.javaVersion());
            JsonOutput.text(json, "java_vendor", environment.javaVendor());
            JsonOutput.text(json, "host", environment.host());
            JsonOutput.text(json, "backend", environment.backend());
            json.writeStringField("started_at", DateTimeFormatter.ISO_INSTANT.format(environment.startedAt()));
            json.writeEndObject();
            JsonOutput.close(json);
        });
        return file;
    }
}
