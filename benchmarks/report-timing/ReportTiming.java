import java.nio.file.Files;
import java.nio.file.Path;

/**
 * Times ReportWriter.write on copies of one run folder in one JVM: the first copy warms the JVM
 * (as ReportWarmup and the run itself do before an in-run report), each later copy is a fresh
 * folder, so its posterior predictive fit is computed again as in a run. Prints one line per
 * timed report: the process's CPU time over the report, and its wall time. Run with the class path of the build to time (see report-builds.sh).
 * usage: java -cp JARS ReportTiming.java RUN_FOLDER COPIES
 */
public class ReportTiming {
    public static void main(String[] args) throws Exception {
        Path run = Path.of(args[0]);
        int copies = Integer.parseInt(args[1]);
        Path work = Files.createTempDirectory("report-timing");
        // CPU time of the whole process (every thread the report uses): on a shared machine it
        // is inflated far less than the wall time by others' load.
        var cpu = (com.sun.management.OperatingSystemMXBean) java.lang.management.ManagementFactory.getOperatingSystemMXBean();
        try {
            for (int i = 0; i <= copies; i++) {
                Path copy = work.resolve("run-" + i);
                copy(run, copy);
                long cpuStart = cpu.getProcessCpuTime();
                long start = System.nanoTime();
                org.skerry.cli.report.ReportWriter.write(copy);
                double seconds = (System.nanoTime() - start) / 1e9;
                double cpuSeconds = (cpu.getProcessCpuTime() - cpuStart) / 1e9;
                if (i > 0) {
                    System.out.printf("report %d cpu %.3f s wall %.3f s%n", i, cpuSeconds, seconds);
                }
            }
        } finally {
            try (var paths = Files.walk(work)) {
                paths.sorted(java.util.Comparator.reverseOrder()).forEach(p -> p.toFile().delete());
            }
        }
    }

    private static void copy(Path from, Path to) throws Exception {
        try (var paths = Files.walk(from)) {
            for (Path p : (Iterable<Path>) paths::iterator) {
                Path rel = from.relativize(p);
                if (rel.toString().startsWith("report")) {
                    continue;
                }
                Path target = to.resolve(rel.toString());
                if (Files.isDirectory(p)) {
                    Files.createDirectories(target);
                } else {
                    Files.copy(p, target);
                }
            }
        }
    }
}
