package org.skerry.benchmarks;

import com.fasterxml.jackson.core.io.NumberOutput;
import java.math.BigDecimal;
import java.nio.charset.StandardCharsets;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.HexFormat;
import java.util.SplittableRandom;
import java.util.concurrent.atomic.AtomicLongArray;
import java.util.stream.IntStream;
import org.skerry.cli.output.DoubleText;

/**
 * Harness, not a test: checks {@link DoubleText#format} (Schubfach digits) against
 * {@link DoubleText#formatExact} (the BigDecimal definition) character for character, and that the
 * text reads back to the same bits, over many doubles of eight kinds; prints counts, mismatches and
 * a SHA-256 of all texts in order, so runs on two JVMs can be compared. Also every power of two
 * and its neighbours, where it counts how often Jackson's shortest digits alone would differ (the
 * case {@code format} hands to the exact path).
 *
 * <p>Usage: {@code java -cp benchmarks/target/benchmarks.jar org.skerry.benchmarks.DoubleTextAgreement [count]}
 * (default 10<sup>8</sup>).
 */
public final class DoubleTextAgreement {

    static final String[] KINDS = {
        "random bit patterns", "uniform [0, 1)", "gaussian x 10^k, |k| <= 30", "15-digit decimals",
        "16-digit decimals", "17-digit decimals", "subnormals", "extremes and powers of two +- ulps",
    };
    private static final int CHUNK = 1 << 20;

    private DoubleTextAgreement() {
    }

    public static void main(String[] args) throws Exception {
        long count = args.length > 0 ? Long.parseLong(args[0]) : 100_000_000L;
        int chunks = (int) ((count + CHUNK - 1) / CHUNK);
        long started = System.nanoTime();
        AtomicLongArray perKind = new AtomicLongArray(KINDS.length);
        AtomicLongArray digitCounts = new AtomicLongArray(18);
        AtomicLongArray mismatches = new AtomicLongArray(2);
        byte[][] digests = new byte[chunks][];
        byte[][] inputDigests = new byte[chunks][];
        IntStream.range(0, chunks).parallel().forEach(chunk -> {
            MessageDigest digest = sha256();
            MessageDigest inputs = sha256();
            SplittableRandom random = new SplittableRandom(20261202L + chunk);
            long size = Math.min(CHUNK, count - (long) chunk * CHUNK);
            for (int i = 0; i < size; i++) {
                int kind = i % KINDS.length;
                double x = sample(kind, random);
                perKind.incrementAndGet(kind);
                inputs.update(Long.toHexString(Double.doubleToRawLongBits(x)).getBytes(StandardCharsets.US_ASCII));
                String text = DoubleText.format(x);
                digest.update(text.getBytes(StandardCharsets.US_ASCII));
                digest.update((byte) '\n');
                String exact = DoubleText.formatExact(x);
                if (!text.equals(exact)) {
                    if (mismatches.getAndIncrement(0) < 20) {
                        System.out.println("text differs: " + hex(x) + " " + text + " exact " + exact);
                    }
                }
                if (Double.isFinite(x) && Double.doubleToRawLongBits(Double.parseDouble(text)) != Double.doubleToRawLongBits(x)) {
                    if (mismatches.getAndIncrement(1) < 20) {
                        System.out.println("does not read back: " + hex(x) + " " + text);
                    }
                }
                if (Double.isFinite(x) && x != 0.0) {
                    digitCounts.incrementAndGet(significantDigits(text));
                }
            }
            digests[chunk] = digest.digest();
            inputDigests[chunk] = inputs.digest();
        });
        MessageDigest all = sha256();
        for (byte[] part : digests) {
            all.update(part);
        }
        MessageDigest allInputs = sha256();
        for (byte[] part : inputDigests) {
            allInputs.update(part);
        }
        double seconds = (System.nanoTime() - started) / 1e9;
        System.out.println("java " + System.getProperty("java.version") + " (" + System.getProperty("java.vendor") + ")");
        System.out.printf("doubles checked: %d in %.0f s%n", count, seconds);
        for (int k = 0; k < KINDS.length; k++) {
            System.out.printf("  %-40s %d%n", KINDS[k], perKind.get(k));
        }
        StringBuilder histogram = new StringBuilder("significant digits written:");
        for (int d = 1; d < digitCounts.length(); d++) {
            if (digitCounts.get(d) > 0) {
                histogram.append(' ').append(d).append(": ").append(digitCounts.get(d)).append(';');
            }
        }
        System.out.println(histogram);
        System.out.println("texts differing from the exact path: " + mismatches.get(0));
        System.out.println("texts not reading back to the same bits: " + mismatches.get(1));
        System.out.println("SHA-256 of all inputs (bits): " + HexFormat.of().formatHex(allInputs.digest()));
        System.out.println("SHA-256 of all texts: " + HexFormat.of().formatHex(all.digest()));
        powersOfTwo();
        if (mismatches.get(0) + mismatches.get(1) > 0) {
            System.exit(1);
        }
    }

    /**
     * Every normal power of two, both signs: how many have 16 shortest digits, and how many of
     * those Jackson's digits differ from the exact path's (so the fallback is needed there).
     */
    private static void powersOfTwo() {
        int sixteen = 0;
        int differ = 0;
        int checked = 0;
        for (int e = -1022; e <= 1023; e++) {
            double x = Math.scalb(1.0, e);
            String shortest = NumberOutput.toString(x, true);
            BigDecimal jackson = new BigDecimal(shortest).stripTrailingZeros();
            BigDecimal exact = new BigDecimal(DoubleText.formatExact(x)).stripTrailingZeros();
            checked++;
            if (jackson.precision() == 16) {
                sixteen++;
                if (jackson.compareTo(exact) != 0) {
                    differ++;
                    if (differ <= 5) {
                        System.out.println("  e.g. 2^" + e + ": shortest " + shortest + ", rounded rule " + exact);
                    }
                }
            } else if (jackson.compareTo(exact) != 0) {
                System.out.println("  UNEXPECTED: 2^" + e + " with " + jackson.precision() + " digits: "
                        + shortest + " against " + exact);
            }
            if (!DoubleText.format(x).equals(DoubleText.formatExact(x))
                    || !DoubleText.format(-x).equals(DoubleText.formatExact(-x))) {
                System.out.println("  UNEXPECTED: format differs at 2^" + e);
            }
        }
        System.out.println("normal powers of two: " + checked + "; with 16 shortest digits: " + sixteen
                + "; of those, shortest != rounded 16 digits (handed to the exact path): " + differ);
    }

    static double sample(int kind, SplittableRandom random) {
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
                return decimal(kind + 12, random);
            case 6:
                return Double.longBitsToDouble(random.nextLong() & 0x800f_ffff_ffff_ffffL);
            default:
                return extreme(random);
        }
    }

    /** A random decimal of {@code digits} significant digits, parsed: its shortest has at most that many. */
    private static double decimal(int digits, SplittableRandom random) {
        long low = 1;
        for (int i = 1; i < digits; i++) {
            low *= 10;
        }
        long significand = random.nextLong(low, low * 10);
        int exponent = random.nextInt(-300, 300);
        double x = Double.parseDouble(significand + "e" + exponent);
        return random.nextBoolean() ? x : -x;
    }

    /** A power of two, the largest or smallest values, or a power of ten, moved a few ulps. */
    private static double extreme(SplittableRandom random) {
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
        long bits = Double.doubleToRawLongBits(base) + random.nextInt(-3, 4);
        double x = Double.longBitsToDouble(bits);
        if (!Double.isFinite(x)) {
            x = base;
        }
        return random.nextBoolean() ? x : -x;
    }

    /** Significant digits in our text: digits after any leading zeros, before the exponent, less trailing zeros. */
    static int significantDigits(String text) {
        int count = 0;
        int zeros = 0;
        for (int i = 0; i < text.length(); i++) {
            char c = text.charAt(i);
            if (c == 'e') {
                break;
            }
            if (c == '0') {
                if (count > 0) {
                    zeros++;
                }
            } else if (c >= '1' && c <= '9') {
                count += zeros + 1;
                zeros = 0;
            }
        }
        return count;
    }

    private static String hex(double x) {
        return Long.toHexString(Double.doubleToRawLongBits(x));
    }

    private static MessageDigest sha256() {
        try {
            return MessageDigest.getInstance("SHA-256");
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException(e);
        }
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
