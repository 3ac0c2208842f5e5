package org.skerry.cli.output;

import java.util.SplittableRandom;

/**
 * Doubles of the kinds where a formatter can go wrong, in a fixed order from a seed: random bit
 * patterns, uniform draws, gaussians over ±30 decades, parsed decimals of 15, 16 and 17 digits
 * (so their shortest forms have at most that many), subnormals, and powers of two, the extremes and
 * powers of ten moved a few ulps.
 */
final class DoubleSamples {

    static final int KINDS = 8;

    private final SplittableRandom random;
    private long drawn;

    DoubleSamples(long seed) {
        random = new SplittableRandom(seed);
    }

    /** The next sample, the kinds taken in turn. */
    double next() {
        int kind = (int) (drawn++ % KINDS);
        switch (kind) {
            case 0:
                return Double.longBitsToDouble(random.nextLong());
            case 1:
                return random.nextDouble();
            case 2:
                return gaussian(random) * StrictMath.pow(10, random.nextInt(-30, 31));
            case 3:
            case 4:
            case 5:
                return decimal(kind + 12);
            case 6:
                return Double.longBitsToDouble(random.nextLong() & 0x800f_ffff_ffff_ffffL);
            default:
                return extreme();
        }
    }

    private double decimal(int digits) {
        long low = 1;
        for (int i = 1; i < digits; i++) {
            low *= 10;
        }
        double x = Double.parseDouble(random.nextLong(low, low * 10) + "e" + random.nextInt(-300, 300));
        return random.nextBoolean() ? x : -x;
    }

    private double extreme() {
        double base;
        switch (random.nextInt(4)) {
            case 0:
                base = Math.scalb(1.0, random.nextInt(-1074, 1024));
                break;
            case 1:
                base = Double.MAX_VALUE;
                break;
            case 2:
                base = Double.MIN_NORMAL;
                break;
            default:
                base = Double.parseDouble("1e" + random.nextInt(-323, 309));
        }
        double x = Double.longBitsToDouble(Double.doubleToRawLongBits(base) + random.nextInt(-3, 4));
        if (!Double.isFinite(x)) {
            x = base;
        }
        return random.nextBoolean() ? x : -x;
    }

    /**
     * A standard normal draw by Box and Muller (1958) in StrictMath, the same on every JVM: the
     * same seeds gave different samples on JDK 17 and 25 with SplittableRandom.nextGaussian.
     */
    private static double gaussian(SplittableRandom random) {
        double u = 1.0 - random.nextDouble();
        return StrictMath.sqrt(-2.0 * StrictMath.log(u)) * StrictMath.cos(2.0 * StrictMath.PI * random.nextDouble());
    }
}
