package org.skerry.engine.model;

/**
 * The set of values one parameter may take, and the bijection from the real line onto it that
 * the moves use: identity for the whole line, {@code x = a + exp(z)} for a lower bound,
 * {@code x = b - exp(z)} for an upper bound, and {@code x = a + (b - a)·logistic(z)} for an
 * interval. Random-walk moves on {@code z} never leave the support; the log-Jacobian
 * {@code log|dx/dz|} keeps them invariant for the target on the model's scale.
 *
 * <p>Immutable. All functions use {@link StrictMath} so that every JVM agrees.
 */
public final class Support {

    /** The kind of bound. */
    public enum Kind { REAL, LOWER_BOUNDED, UPPER_BOUNDED, INTERVAL }

    private static final Support REAL_LINE = new Support(Kind.REAL,
            Double.NEGATIVE_INFINITY, Double.POSITIVE_INFINITY);

    private final Kind kind;
    private final double lower;
    private final double upper;

    private Support(Kind kind, double lower, double upper) {
        this.kind = kind;
        this.lower = lower;
        this.upper = upper;
    }

    /** The whole real line. */
    public static Support real() {
        return REAL_LINE;
    }

    /** (0, ∞). */
    public static Support positive() {
        return lowerBounded(0.0);
    }

    /** (lower, ∞). */
    public static Support lowerBounded(double lower) {
        requireFinite("lower", lower);
        return new Support(Kind.LOWER_BOUNDED, lower, Double.POSITIVE_INFINITY);
    }

    /** (−∞, upper). */
    public static Support upperBounded(double upper) {
        requireFinite("upper", upper);
        return new Support(Kind.UPPER_BOUNDED, Double.NEGATIVE_INFINITY, upper);
    }

    /** (lower, upper). */
    public static Support interval(double lower, double upper) {
        requireFinite("lower", lower);
        requireFinite("upper", upper);
        if (!(lower < upper)) {
            throw new IllegalArgumentException(
                    "interval support needs lower < upper, was lower=" + lower + ", upper=" + upper);
        }
        return new Support(Kind.INTERVAL, lower, upper);
    }

    /** The smallest support that holds both bounds; either may be infinite. */
    public static Support of(double lower, double upper) {
        boolean hasLower = lower != Double.NEGATIVE_INFINITY;
        boolean hasUpper = upper != Double.POSITIVE_INFINITY;
        if (hasLower && hasUpper) {
            return interval(lower, upper);
        }
        if (hasLower) {
            return lowerBounded(lower);
        }
        if (hasUpper) {
            return upperBounded(upper);
        }
        return REAL_LINE;
    }

    private static void requireFinite(String name, double value) {
        if (!Double.isFinite(value)) {
            throw new IllegalArgumentException("support bound " + name + " must be finite, was " + value);
        }
    }

    public Kind kind() {
        return kind;
    }

    public double lower() {
        return lower;
    }

    public double upper() {
        return upper;
    }

    /** Whether {@code x} lies strictly inside the support (bounds themselves are excluded). */
    public boolean contains(double x) {
        return x > lower && x < upper;
    }

    /** The unconstrained coordinate {@code z} of a value {@code x} inside the support. */
    public double toUnconstrained(double x) {
        switch (kind) {
            case LOWER_BOUNDED:
                return StrictMath.log(x - lower);
            case UPPER_BOUNDED:
                return StrictMath.log(upper - x);
            case INTERVAL: {
                double p = (x - lower) / (upper - lower);
                return StrictMath.log(p) - StrictMath.log1p(-p);
            }
            default:
                return x;
        }
    }

    /** The value on the model's scale of an unconstrained coordinate {@code z}. */
    public double fromUnconstrained(double z) {
        switch (kind) {
            case LOWER_BOUNDED:
                return lower + StrictMath.exp(z);
            case UPPER_BOUNDED:
                return upper - StrictMath.exp(z);
            case INTERVAL: {
                double p = z >= 0 ? 1.0 / (1.0 + StrictMath.exp(-z)) : StrictMath.exp(z) / (1.0 + StrictMath.exp(z));
                return lower + (upper - lower) * p;
            }
            default:
                return z;
        }
    }

    /** {@code log|dx/dz|} at the unconstrained coordinate {@code z}. */
    public double logJacobian(double z) {
        switch (kind) {
            case LOWER_BOUNDED:
            case UPPER_BOUNDED:
                return z;
            case INTERVAL:
                // log(b - a) + log σ(z) + log σ(−z), written to stay finite for large |z|.
                return StrictMath.log(upper - lower) - softplus(-z) - softplus(z);
            default:
                return 0.0;
        }
    }

    private static double softplus(double t) {
        return t > 0 ? t + StrictMath.log1p(StrictMath.exp(-t)) : StrictMath.log1p(StrictMath.exp(t));
    }

    @Override
    public String toString() {
        switch (kind) {
            case LOWER_BOUNDED:
                return "(" + lower + ", inf)";
            case UPPER_BOUNDED:
                return "(-inf, " + upper + ")";
            case INTERVAL:
                return "(" + lower + ", " + upper + ")";
            default:
                return "(-inf, inf)";
        }
    }
}
