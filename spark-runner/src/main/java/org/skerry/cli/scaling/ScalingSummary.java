package org.skerry.cli.scaling;

import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.skerry.cli.output.AtomicFile;
import org.skerry.engine.model.builtin.BusyWork;

/**
 * The study's {@code summary.md}: the setup, a table of every point (median and range over
 * repeats), the plots, and what each column of {@code scaling.csv} measures and how.
 */
final class ScalingSummary {

    /** What each column of scaling.csv holds; the summary and the README say the same. */
    static final String COLUMNS = String.join("\n",
            "| column | what it is |",
            "|---|---|",
            "| `point`, `repeat` | the grid point (its axis values) and the repeat; the run folder is `runs/<point>-r<repeat>` |",
            "| `cores` | cores the run could use: `local[k]` (Spark local mode), `spark.cores.max` (other Spark masters) or `backend.threads` |",
            "| `particles`, `partitions`, `islands` | N; blocks of the Spark population (`backend.partitions`; with a task per block also the tasks per stage; empty for threads); islands (0 = global resampling) |",
            "| one column per axis | the axis value of the point |",
            "| `iterations`, `evaluations` | tempering iterations after the initial draw; likelihood evaluations of the run |",
            "| `wall_seconds` | the whole run as `skerry run` times it, backend start-up (Spark context) included |",
            "| `loop_seconds` | the sampler loop: sum of all phase times below; speed-up and efficiency use this |",
            "| `evaluate_seconds` | initial draw and its likelihood evaluations (phase `evaluate` of iterations.csv) |",
            "| `reduce_seconds` | `temperature` + `reweight` + `fit`: gathering two scalars per particle and choosing the temperature, reweighting, moment sums and proposal fit |",
            "| `resample_seconds`, `redistribute_seconds` | offspring counts and expansion; rebalancing surplus copies between blocks |",
            "| `move_seconds` | Metropolis–Hastings steps, where the likelihood calls of iterations 1… happen |",
            "| `checkpoint_seconds` | writing checkpoints (0 while the run writes none) |",
            "| `temperature_seconds`, `reweight_seconds`, `fit_seconds` | the three parts of `reduce_seconds` |",
            "| `particles_sent_to_other_partitions` | particles sent to another partition (block) while rebalancing surplus copies after resampling, summed over iterations; 0 in island mode |",
            "| `driver_bytes_received` | Spark only: sum of `TaskMetrics.resultSize` over the run's tasks (collected results: per-particle scalars for tempering, per-block reports and sums), the final export of the particles excepted; no shuffle, broadcast or heartbeat traffic; empty for the thread backend, whose blocks never leave the process |",
            "| `driver_bytes_per_iteration` | `driver_bytes_received` ÷ iterations |",
            "| `export_bytes_received` | Spark only: task results of the one final export of the particles (whole blocks: N × (d + 5) numbers — values, log prior, log-likelihood, log weight, index, ancestor) |",
            "| `driver_cpu_seconds_per_iteration` | CPU time of the thread that runs the sampler loop (ThreadMXBean), from the end of iteration 0 to the end of the run, ÷ iterations: the driver's own work — temperature choice, resampling plan, proposal fit, handling collected results — without executor work or Spark's scheduler threads |",
            "| `evaluations_per_second` | `evaluations` ÷ `loop_seconds` |",
            "| `speedup`, `efficiency` | against the run of the same repeat at the point of the same group (same values on all other axes) with the fewest cores k₀. Strong: speed-up = T(k₀)/T(k), efficiency = speed-up · k₀/k. Weak: efficiency = T(k₀)/T(k), speed-up = efficiency · k/k₀ |",
            "| `load_average` | the machine's one-minute load average when the run started |",
            "| `run_folder` | the run's folder, relative to the study folder |");

    private ScalingSummary() {
    }

    static Path write(ScalingTable table, Path folder, double loadBefore, double loadAfter) throws IOException {
        StudyFile study = table.study();
        StringBuilder md = new StringBuilder();
        md.append("# Scaling study `").append(study.name()).append("`\n\n");
        md.append("Base run file `").append(study.base()).append("`, ").append(study.scaling().name().toLowerCase(Locale.ROOT))
                .append(" scaling").append(study.scaling() == StudyFile.Scaling.WEAK
                        ? " (" + study.particlesPerCore() + " particles per core)" : "")
                .append(", ").append(study.repeats()).append(" repeat(s) per point, ").append(study.points().size())
                .append(" point(s). Machine: ").append(Runtime.getRuntime().availableProcessors())
                .append(" cores available to the JVM; one-minute load average ")
                .append(format(loadBefore)).append(" before the study and ").append(format(loadAfter)).append(" after");
        boolean synthetic = study.points().stream().anyMatch(p -> "costly-normal".equals(p.spec().model().name()));
        if (synthetic) {
            md.append("; busy-work calibration ").append(String.format(Locale.ROOT, "%.1f", BusyWork.unitsPerMicrosecond()))
                    .append(" work units per microsecond in this JVM (`SKERRY_JAVA_OPTS=-D").append(BusyWork.PROPERTY)
                    .append("=...` fixes it, to compare with studies run in another JVM)");
        }
        md.append(".\n\n");
        md.append("Every point × repeat is an ordinary run folder under `runs/`; `scaling.csv` has one row per run. ")
                .append("Figures below are the median over repeats with the range in brackets.\n\n");
        md.append("| point | cores | N | loop s | speed-up | efficiency | move share | driver B/iteration | driver CPU ms/iteration |\n");
        md.append("|---|---|---|---|---|---|---|---|---|\n");
        Map<String, List<ScalingTable.Row>> byPoint = new LinkedHashMap<>();
        for (ScalingTable.Row row : table.rows()) {
            byPoint.computeIfAbsent(row.point().label(), l -> new ArrayList<>()).add(row);
        }
        byPoint.forEach((label, rows) -> {
            ScalingTable.Row first = rows.get(0);
            List<Double> loop = new ArrayList<>();
            List<Double> speedup = new ArrayList<>();
            List<Double> efficiency = new ArrayList<>();
            List<Double> move = new ArrayList<>();
            List<Double> bytes = new ArrayList<>();
            List<Double> cpu = new ArrayList<>();
            for (ScalingTable.Row row : rows) {
                loop.add(row.m().loopSeconds());
                speedup.add(row.speedup());
                efficiency.add(row.efficiency());
                move.add(row.m().phases().move() / row.m().loopSeconds());
                if (row.bytesPerIteration() >= 0) {
                    bytes.add(row.bytesPerIteration());
                }
                if (row.driverCpuPerIteration() >= 0) {
                    cpu.add(row.driverCpuPerIteration() * 1000);
                }
            }
            md.append("| ").append(label).append(" | ").append(first.point().cores() == 0 ? "–" : first.point().cores())
                    .append(" | ").append(first.m().particles()).append(" | ").append(spread(loop, "%.3f"))
                    .append(" | ").append(spread(speedup, "%.3f")).append(" | ").append(spread(efficiency, "%.3f"))
                    .append(" | ").append(spread(move, "%.2f")).append(" | ")
                    .append(bytes.isEmpty() ? "–" : spread(bytes, "%.0f")).append(" | ")
                    .append(cpu.isEmpty() ? "–" : spread(cpu, "%.2f")).append(" |\n");
        });
        md.append("\n## Plots\n\n");
        md.append("![speed-up](speedup.svg)\n\n![parallel efficiency](efficiency.svg)\n\n![time per phase](phases.svg)\n\n");
        md.append("PNG copies: `speedup.png`, `efficiency.png`, `phases.png`.\n\n");
        md.append("## What the columns of scaling.csv measure\n\n").append(COLUMNS).append("\n\n");
        md.append("Phase times are the runs' own (the `seconds` of each iteration, as in `iterations.csv`). ")
                .append("On a shared machine other processes take cores from the run: compare the load averages, ")
                .append("and prefer the paired speed-ups (repeat r against repeat r) to single times.\n");
        Path file = folder.resolve("summary.md");
        AtomicFile.writeString(file, md.toString());
        return file;
    }

    private static String spread(List<Double> values, String pattern) {
        Spread s = Spread.of(values);
        String median = String.format(Locale.ROOT, pattern, s.median());
        if (s.count() == 1) {
            return median;
        }
        return median + " [" + String.format(Locale.ROOT, pattern, s.min()) + "–"
                + String.format(Locale.ROOT, pattern, s.max()) + "]";
    }

    private static String format(double load) {
        return load < 0 ? "unknown" : String.format(Locale.ROOT, "%.2f", load);
    }
}
