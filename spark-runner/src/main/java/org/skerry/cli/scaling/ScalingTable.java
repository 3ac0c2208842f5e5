package org.skerry.cli.scaling;

import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVPrinter;
import org.skerry.cli.output.AtomicFile;
import org.skerry.cli.output.DoubleText;
import org.skerry.engine.sampler.PhaseTimes;

/**
 * The study's results, one row per run, with speed-up and parallel efficiency against the run of
 * the same repeat at the point of its group (same values on every axis but cores) with the
 * fewest cores — pairs measured minutes apart, so slow drifts in machine load cancel. Strong
 * scaling: speed-up = T₀ / T and efficiency = speed-up · k₀ / k. Weak scaling: efficiency = T₀ / T
 * and the (scaled) speed-up = efficiency · k / k₀. T is the sampler loop's time (the sum of its
 * phase times); with no cores axis every point is its own baseline.
 */
final class ScalingTable {

    /** One run with its derived figures. */
    record Row(StudyRunner.Run run, double speedup, double efficiency) {
        StudyPoint point() {
            return run.point();
        }

        RunMeasurement m() {
            return run.measurement();
        }

        /** Reduce = temperature + reweight + fit: the steps that gather or combine across blocks. */
        double reduceSeconds() {
            PhaseTimes p = m().phases();
            return p.temperature() + p.reweight() + p.fit();
        }

        double evaluationsPerSecond() {
            return m().evaluations() / m().loopSeconds();
        }

        /** Bytes of task results per tempering iteration, or −1 when not measured. */
        double bytesPerIteration() {
            return m().loopBytes() < 0 ? -1 : (double) m().loopBytes() / Math.max(1, m().iterations());
        }

        double driverCpuPerIteration() {
            return m().driverCpuSeconds() < 0 ? -1 : m().driverCpuSeconds() / Math.max(1, m().iterations());
        }
    }

    private final StudyFile study;
    private final List<Row> rows;

    ScalingTable(StudyFile study, List<StudyRunner.Run> runs) {
        this.study = study;
        List<Row> out = new ArrayList<>();
        for (StudyRunner.Run run : runs) {
            StudyRunner.Run base = baseline(runs, run);
            double ratio = base.measurement().loopSeconds() / run.measurement().loopSeconds();
            double cores = Math.max(1, run.point().cores());
            double baseCores = Math.max(1, base.point().cores());
            if (study.scaling() == StudyFile.Scaling.STRONG) {
                out.add(new Row(run, ratio, ratio * baseCores / cores));
            } else {
                out.add(new Row(run, ratio * cores / baseCores, ratio));
            }
        }
        this.rows = List.copyOf(out);
    }

    private static StudyRunner.Run baseline(List<StudyRunner.Run> runs, StudyRunner.Run run) {
        StudyRunner.Run best = run;
        for (StudyRunner.Run other : runs) {
            if (other.repeat() == run.repeat() && other.point().group() == run.point().group()
                    && other.point().cores() < best.point().cores()) {
                best = other;
            }
        }
        return best;
    }

    StudyFile study() {
        return study;
    }

    List<Row> rows() {
        return rows;
    }

    /** The columns of {@code scaling.csv}, in order (documented in the study's summary and the README). */
    List<String> columns() {
        List<String> columns = new ArrayList<>(List.of("point", "repeat", "cores", "particles", "partitions", "islands"));
        for (String key : study.axisKeys()) {
            columns.add(key.replace("\"", ""));
        }
        columns.addAll(List.of("iterations", "evaluations", "wall_seconds", "loop_seconds", "evaluate_seconds",
                "reduce_seconds", "resample_seconds", "redistribute_seconds", "move_seconds", "checkpoint_seconds",
                "temperature_seconds", "reweight_seconds", "fit_seconds", "particles_sent_to_other_partitions", "driver_bytes_received",
                "driver_bytes_per_iteration", "export_bytes_received", "driver_cpu_seconds_per_iteration",
                "evaluations_per_second", "speedup", "efficiency", "load_average", "run_folder"));
        return columns;
    }

    /** Writes {@code scaling.csv} atomically. */
    Path writeCsv(Path folder, Path studyFolder) throws IOException {
        Path file = folder.resolve("scaling.csv");
        AtomicFile.writeText(file, writer -> {
            CSVPrinter csv = new CSVPrinter(writer, CSVFormat.DEFAULT.builder().setRecordSeparator("\n")
                    .setHeader(columns().toArray(new String[0])).get());
            for (Row row : rows) {
                List<Object> cells = new ArrayList<>();
                RunMeasurement m = row.m();
                PhaseTimes p = m.phases();
                cells.add(row.point().label());
                cells.add(row.run().repeat());
                cells.add(row.point().cores() == 0 ? "" : row.point().cores());
                cells.add(m.particles());
                cells.add(m.partitions() < 0 ? "" : m.partitions());
                cells.add(row.point().spec().sampler().islands().count());
                for (String key : study.axisKeys()) {
                    cells.add(row.point().values().get(key));
                }
                cells.add(m.iterations());
                cells.add(m.evaluations());
                for (double v : new double[] {m.wallSeconds(), m.loopSeconds(), p.evaluate(), row.reduceSeconds(),
                    p.resample(), p.redistribute(), p.move(), p.checkpoint(), p.temperature(), p.reweight(), p.fit()}) {
                    cells.add(DoubleText.format(v));
                }
                cells.add(m.particlesMoved() < 0 ? "" : m.particlesMoved());
                cells.add(m.loopBytes() < 0 ? "" : m.loopBytes());
                cells.add(m.loopBytes() < 0 ? "" : DoubleText.format(row.bytesPerIteration()));
                cells.add(m.exportBytes() < 0 ? "" : m.exportBytes());
                cells.add(m.driverCpuSeconds() < 0 ? "" : DoubleText.format(row.driverCpuPerIteration()));
                cells.add(DoubleText.format(row.evaluationsPerSecond()));
                cells.add(DoubleText.format(row.speedup()));
                cells.add(DoubleText.format(row.efficiency()));
                cells.add(m.loadAverage() < 0 ? "" : DoubleText.format(m.loadAverage()));
                cells.add(studyFolder.relativize(row.run().folder()).toString());
                csv.printRecord(cells);
            }
            csv.flush();
        });
        return file;
    }
}
