package org.skerry.benchmarks;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.SplittableRandom;
import java.util.stream.Stream;
import org.skerry.cli.output.ParticlesArrow;
import org.skerry.cli.output.ParticlesCsv;
import org.skerry.engine.population.FinalParticles;
import org.skerry.engine.population.ParticleRows;

/**
 * Paired write time of {@code particles.csv} against {@code particles.arrow} for the same final
 * population of N particles in d dimensions (posterior-like draws, weights, log-likelihoods and
 * log priors), each file written whole as a run writes it (atomically, forced to the device), the
 * order alternating each round so that a burst of load from other work hits one round rather than
 * one format. Prints per size the median, min and max of the per-round ratio CSV ÷ Arrow, the
 * median seconds and ns per number of each, and the files' sizes.
 *
 * <p>Usage (Arrow Java needs java.nio opened on Java 17):
 * {@code java --add-opens=java.base/java.nio=ALL-UNNAMED -cp benchmarks/target/benchmarks.jar
 * org.skerry.benchmarks.ParticlesWriteSpeed [N,N,...] [d] [rounds] [folder]}
 * (defaults 1000000, 10, 5, the system's temporary folder), after one warm-up round per size.
 */
public final class ParticlesWriteSpeed {

    private static final int CHUNK = 1 << 16;

    private ParticlesWriteSpeed() {
    }

    public static void main(String[] args) throws IOException {
        int[] sizes = Arrays.stream((args.length > 0 ? args[0] : "1000000").split(",")).mapToInt(Integer::parseInt)
                .toArray();
        int d = args.length > 1 ? Integer.parseInt(args[1]) : 10;
        int rounds = args.length > 2 ? Integer.parseInt(args[2]) : 5;
        Path base = args.length > 3 ? Path.of(args[3]) : Path.of(System.getProperty("java.io.tmpdir"));
        Path folder = Files.createTempDirectory(base, "particles-write-speed");
        List<String> names = new ArrayList<>();
        for (int k = 0; k < d; k++) {
            names.add("theta_" + k);
        }
        try {
            for (int n : sizes) {
                FinalParticles particles = population(n, d);
                double[] weights = new double[n];
                Arrays.fill(weights, 1.0 / n);
                double[] csv = new double[rounds];
                double[] arrow = new double[rounds];
                double[] ratio = new double[rounds];
                long csvBytes = 0;
                long arrowBytes = 0;
                for (int round = -1; round < rounds; round++) {
                    double c;
                    double a;
                    if ((round & 1) == 0) {
                        c = csv(folder, names, particles, weights);
                        a = arrow(folder, names, particles, weights);
                    } else {
                        a = arrow(folder, names, particles, weights);
                        c = csv(folder, names, particles, weights);
                    }
                    if (round >= 0) {
                        csv[round] = c;
                        arrow[round] = a;
                        ratio[round] = c / a;
                    }
                    csvBytes = Files.size(folder.resolve(ParticlesCsv.FILE_NAME));
                    arrowBytes = Files.size(folder.resolve(ParticlesArrow.FILE_NAME));
                }
                Arrays.sort(csv);
                Arrays.sort(arrow);
                Arrays.sort(ratio);
                double numbers = (double) n * (d + 3);
                System.out.printf("N=%d d=%d numbers=%.3g: csv/arrow median %.2f (min %.2f, max %.2f) over %d rounds;"
                        + " csv %.3f s (%.0f ns/number, %.1f MB), arrow %.3f s (%.1f ns/number, %.1f MB) (medians)%n",
                        n, d, numbers, ratio[rounds / 2], ratio[0], ratio[rounds - 1], rounds, csv[rounds / 2],
                        csv[rounds / 2] * 1e9 / numbers, csvBytes / 1e6, arrow[rounds / 2],
                        arrow[rounds / 2] * 1e9 / numbers, arrowBytes / 1e6);
            }
        } finally {
            try (Stream<Path> files = Files.list(folder)) {
                for (Path file : files.toList()) {
                    Files.delete(file);
                }
            }
            Files.delete(folder);
        }
    }

    private static double csv(Path folder, List<String> names, FinalParticles particles, double[] weights)
            throws IOException {
        long start = System.nanoTime();
        ParticlesCsv.write(folder, names, particles, weights);
        return (System.nanoTime() - start) * 1e-9;
    }

    /** As the run writes it (RunOutputs): runs of 64 Ki rows handed to the streaming writer. */
    private static double arrow(Path folder, List<String> names, FinalParticles particles, double[] weights)
            throws IOException {
        long start = System.nanoTime();
        int d = particles.dimension();
        int n = particles.size();
        double[] values = new double[CHUNK * d];
        double[] w = new double[CHUNK];
        double[] logLikelihood = new double[CHUNK];
        double[] logPrior = new double[CHUNK];
        try (ParticlesArrow writer = ParticlesArrow.open(folder, names)) {
            for (int first = 0; first < n; first += CHUNK) {
                int count = Math.min(CHUNK, n - first);
                System.arraycopy(particles.values(), first * d, values, 0, count * d);
                System.arraycopy(weights, first, w, 0, count);
                System.arraycopy(particles.logLikelihood(), first, logLikelihood, 0, count);
                System.arraycopy(particles.logPrior(), first, logPrior, 0, count);
                writer.append(new ParticleRows(first, count, d, values, w, logLikelihood, logPrior));
            }
            writer.finish();
        }
        return (System.nanoTime() - start) * 1e-9;
    }

    private static FinalParticles population(int n, int d) {
        SplittableRandom random = new SplittableRandom(1946L);
        double[] values = new double[n * d];
        for (int i = 0; i < values.length; i++) {
            values[i] = 3.0 + 0.7 * random.nextGaussian();
        }
        double[] logLikelihood = new double[n];
        double[] logPrior = new double[n];
        for (int i = 0; i < n; i++) {
            logLikelihood[i] = -50.0 + 20.0 * random.nextGaussian();
            logPrior[i] = -10.0 + random.nextGaussian();
        }
        long[] index = new long[n];
        for (int i = 0; i < n; i++) {
            index[i] = i;
        }
        return new FinalParticles(d, n, values, new double[n], logPrior, logLikelihood, index, index.clone());
    }
}
