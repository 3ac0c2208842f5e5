package org.skerry.cli.output;

/**
 * Which files hold the final population ({@code output.particles-format}): {@code particles.csv},
 * {@code particles.arrow}, both, or — {@code auto}, the default — the CSV for a population of
 * fewer than {@link #AUTO_ARROW_FROM} numbers and Arrow from there on. Below that size the CSV,
 * which every tool opens, is written in under half a second; above it the CSV costs about 0.2 µs
 * and 18 bytes per number, Arrow under 20 ns and 8 bytes (N = 10⁶, d = 10: 2.5 s against 0.22 s;
 * benchmarks/RESULTS.md, "Particles: CSV against Arrow").
 */
public enum ParticlesFormat {
    AUTO, CSV, ARROW, BOTH;

    /**
     * Numbers, N·(d + 3) (each particle's parameters, weight, log-likelihood and log prior), from
     * which {@code auto} writes Arrow instead of CSV: 2·10⁶, e.g. N = 153 847 at d = 10.
     */
    public static final long AUTO_ARROW_FROM = 2_000_000L;

    /** The setting's value, as written in a run file. */
    public String setting() {
        return name().toLowerCase(java.util.Locale.ROOT);
    }

    /** Whether {@code particles.csv} is written for N particles of dimension d. */
    public boolean writesCsv(long particles, int dimension) {
        return this == CSV || this == BOTH || (this == AUTO && numbers(particles, dimension) < AUTO_ARROW_FROM);
    }

    /** Whether {@code particles.arrow} is written for N particles of dimension d. */
    public boolean writesArrow(long particles, int dimension) {
        return this == ARROW || this == BOTH || (this == AUTO && numbers(particles, dimension) >= AUTO_ARROW_FROM);
    }

    private static long numbers(long particles, int dimension) {
        return particles * (dimension + ParticlesCsv.FIXED_COLUMNS.size());
    }
}
