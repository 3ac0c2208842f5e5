package org.skerry.cli.scaling;

import com.typesafe.config.Config;
import com.typesafe.config.ConfigException;
import com.typesafe.config.ConfigFactory;
import com.typesafe.config.ConfigRenderOptions;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.Map;
import org.skerry.cli.output.AtomicFile;
import org.skerry.engine.sampler.IterationRecord;
import org.skerry.engine.sampler.PhaseTimes;

/**
 * What the study measured of one finished run, kept beside the run's own files in
 * {@code scaling-run.json} so that a resumed study rebuilds its table without running it again.
 * Phase times are the run's own (summed over {@link IterationRecord#seconds()}); driver CPU time
 * and bytes are measured around it. A figure that was not measured is −1.
 *
 * @param iterations      tempering iterations after the initial draw
 * @param particles       N
 * @param partitions      blocks of the population (Spark: backend.partitions, or as its tasks show them; threads: blocks), or −1
 * @param evaluations     likelihood evaluations of the run
 * @param wallSeconds     the whole run as {@code skerry run} times it (backend start-up included)
 * @param phases          seconds per phase, summed over iterations
 * @param particlesMoved  particles sent to another partition (block) while rebalancing, summed over iterations
 * @param loopBytes       bytes of task results the driver received, the final export excepted
 * @param exportBytes     bytes of task results of the final export of the particles
 * @param driverCpuSeconds CPU time of the driver thread over iterations 1 … T
 * @param loadAverage     the machine's one-minute load average when the run started
 * @param backend         the backend's description
 */
public record RunMeasurement(int iterations, int particles, long partitions, long evaluations, double wallSeconds,
        PhaseTimes phases, long particlesMoved, long loopBytes, long exportBytes, double driverCpuSeconds,
        double loadAverage, String backend) {

    /** The file's name in the run folder. */
    public static final String FILE_NAME = "scaling-run.json";

    /** Seconds of the sampler loop: the sum of every phase (backend start-up and output excluded). */
    public double loopSeconds() {
        return phases.total();
    }

    /** Writes this measurement into {@code folder}, atomically. */
    void write(Path folder) throws IOException {
        Map<String, Object> map = new LinkedHashMap<>();
        map.put("iterations", iterations);
        map.put("particles", particles);
        map.put("partitions", partitions);
        map.put("evaluations", evaluations);
        map.put("wall_seconds", wallSeconds);
        Map<String, Object> phaseMap = new LinkedHashMap<>();
        phaseMap.put("evaluate", phases.evaluate());
        phaseMap.put("temperature", phases.temperature());
        phaseMap.put("reweight", phases.reweight());
        phaseMap.put("resample", phases.resample());
        phaseMap.put("redistribute", phases.redistribute());
        phaseMap.put("fit", phases.fit());
        phaseMap.put("move", phases.move());
        phaseMap.put("checkpoint", phases.checkpoint());
        map.put("phase_seconds", phaseMap);
        map.put("particles_sent_to_other_partitions", particlesMoved);
        map.put("driver_bytes_received", loopBytes);
        map.put("export_bytes_received", exportBytes);
        map.put("driver_cpu_seconds", driverCpuSeconds);
        map.put("load_average", loadAverage);
        map.put("backend", backend);
        String json = ConfigFactory.parseMap(map).root().render(ConfigRenderOptions.concise().setFormatted(true));
        AtomicFile.writeString(folder.resolve(FILE_NAME), json + "\n");
    }

    /** Reads a measurement written by {@link #write}, or null when the folder has none. */
    static RunMeasurement read(Path folder) {
        Path file = folder.resolve(FILE_NAME);
        if (!Files.isRegularFile(file)) {
            return null;
        }
        try {
            Config c = ConfigFactory.parseFile(file.toFile());
            return new RunMeasurement(c.getInt("iterations"), c.getInt("particles"), c.getLong("partitions"),
                    c.getLong("evaluations"), c.getDouble("wall_seconds"), phases(c),
                    c.getLong("particles_sent_to_other_partitions"), c.getLong("driver_bytes_received"),
                    c.getLong("export_bytes_received"), c.getDouble("driver_cpu_seconds"), c.getDouble("load_average"), c.getString("backend"));
        } catch (ConfigException e) {
            throw new IllegalStateException("cannot read " + file + " (remove the run folder to run it again): "
                    + e.getMessage(), e);
        }
    }

    /** The {@code phase_seconds} object of this file or of a run's {@code timing.json}. */
    static PhaseTimes phases(Config file) {
        Config p = file.getConfig("phase_seconds");
        return new PhaseTimes(p.getDouble("evaluate"), p.getDouble("temperature"), p.getDouble("reweight"),
                p.getDouble("resample"), p.getDouble("redistribute"), p.getDouble("fit"), p.getDouble("move"),
                p.hasPath("checkpoint") ? p.getDouble("checkpoint") : 0);
    }

    /** Sums the phase times of a run's iterations. */
    static PhaseTimes sum(Iterable<IterationRecord> records) {
        PhaseTimes total = PhaseTimes.ZERO;
        for (IterationRecord record : records) {
            total = total.plus(record.seconds());
        }
        return total;
    }
}
