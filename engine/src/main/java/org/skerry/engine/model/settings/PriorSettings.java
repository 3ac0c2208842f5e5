package org.skerry.engine.model.settings;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.Collections;
import java.util.List;
import org.skerry.engine.model.prior.Beta;
import org.skerry.engine.model.prior.Exponential;
import org.skerry.engine.model.prior.Gamma;
import org.skerry.engine.model.prior.HalfNormal;
import org.skerry.engine.model.prior.IndependentPrior;
import org.skerry.engine.model.prior.LogNormal;
import org.skerry.engine.model.prior.Normal;
import org.skerry.engine.model.prior.Uniform;
import org.skerry.engine.model.prior.UnivariateDistribution;

/**
 * Reads univariate priors from settings. A prior is an object naming its distribution and that
 * distribution's parameters, for example {@code prior.x = { distribution = normal, mean = 0,
 * sd = 10 }}. The distributions and their keys:
 * <pre>
 *   normal       mean, sd          lognormal    meanlog, sdlog
 *   uniform      lower, upper      gamma        shape, rate
 *   beta         a, b              half-normal  sd
 *   exponential  rate
 * </pre>
 * Every key is required and no other key is allowed, so a misspelt key is caught rather than
 * silently ignored. Failures name {@link ModelSettings#where} of the offending key and its value.
 */
public final class PriorSettings {

    /** The key naming the distribution inside a prior object. */
    public static final String DISTRIBUTION = "distribution";

    private static final List<String> NAMES = Collections.unmodifiableList(Arrays.asList(
            "normal", "lognormal", "uniform", "gamma", "beta", "half-normal", "exponential"));

    private PriorSettings() {
    }

    /** The distribution names understood, in documentation order. */
    public static List<String> distributionNames() {
        return NAMES;
    }

    /**
     * What distribution {@code name} is, in one line: its density or definition, the range of its
     * parameters and the values it takes (for {@code skerry models}); fails naming the known names.
     */
    public static String description(String name) {
        switch (name) {
            case "normal":
                return "mean and standard deviation sd > 0; any real value";
            case "lognormal":
                return "the log of the value is normal(meanlog, sdlog), sdlog > 0; median exp(meanlog); values > 0";
            case "uniform":
                return "flat between finite bounds lower < upper; values in (lower, upper)";
            case "gamma":
                return "density rate^shape x^(shape-1) exp(-rate x) / Gamma(shape), shape, rate > 0; "
                        + "mean shape/rate; values > 0";
            case "beta":
                return "density x^(a-1) (1-x)^(b-1) / B(a, b), a, b > 0; mean a/(a+b); values in (0, 1)";
            case "half-normal":
                return "|normal(0, sd)|, sd > 0; mean sd*sqrt(2/pi); values > 0";
            case "exponential":
                return "density rate exp(-rate x), rate > 0; mean 1/rate; values > 0";
            default:
                return parameterKeys(name).toString(); // fails with the known names
        }
    }

    /** The parameter keys of distribution {@code name}, or fails naming the known names. */
    public static List<String> parameterKeys(String name) {
        switch (name) {
            case "normal":
                return List.of("mean", "sd");
            case "lognormal":
                return List.of("meanlog", "sdlog");
            case "uniform":
                return List.of("lower", "upper");
            case "gamma":
                return List.of("shape", "rate");
            case "beta":
                return List.of("a", "b");
            case "half-normal":
                return List.of("sd");
            case "exponential":
                return List.of("rate");
            default:
                throw new IllegalArgumentException("unknown distribution '" + name
                        + "'; known distributions: " + NAMES);
        }
    }

    /**
     * The distribution described by the object at {@code key}.
     *
     * @throws IllegalArgumentException if {@code key} holds no object, the distribution is
     *     unknown, a parameter is missing, not a number, out of range, or a key is not one of the
     *     distribution's parameters
     */
    public static UnivariateDistribution distribution(ModelSettings settings, String key) {
        if (!settings.has(key)) {
            throw new IllegalArgumentException(settings.where(key) + ": missing prior");
        }
        ModelSettings spec = settings.at(key);
        String name = spec.getString(DISTRIBUTION);
        List<String> parameterKeys;
        try {
            parameterKeys = parameterKeys(name);
        } catch (IllegalArgumentException e) {
            throw new IllegalArgumentException(spec.where(DISTRIBUTION) + ": " + e.getMessage(), e);
        }
        for (String present : spec.keys()) {
            if (!present.equals(DISTRIBUTION) && !parameterKeys.contains(present)) {
                throw new IllegalArgumentException(spec.where(present) + ": '" + present
                        + "' is not a parameter of " + name + "; expected " + parameterKeys);
            }
        }
        double[] values = new double[parameterKeys.size()];
        for (int i = 0; i < values.length; i++) {
            values[i] = spec.getDouble(parameterKeys.get(i));
        }
        try {
            return build(name, values);
        } catch (IllegalArgumentException e) {
            throw new IllegalArgumentException(settings.where(key) + ": " + name + " prior: "
                    + e.getMessage(), e);
        }
    }

    /**
     * One prior per parameter, read from {@code key.<name>} for each name, as an independent
     * product.
     */
    public static IndependentPrior independent(ModelSettings settings, String key, List<String> names) {
        List<UnivariateDistribution> marginals = new ArrayList<>();
        for (String name : names) {
            marginals.add(distribution(settings, key + "." + name));
        }
        return IndependentPrior.of(marginals);
    }

    private static UnivariateDistribution build(String name, double[] v) {
        switch (name) {
            case "normal":
                return Normal.of(v[0], v[1]);
            case "lognormal":
                return LogNormal.of(v[0], v[1]);
            case "uniform":
                return Uniform.of(v[0], v[1]);
            case "gamma":
                return Gamma.of(v[0], v[1]);
            case "beta":
                return Beta.of(v[0], v[1]);
            case "half-normal":
                return HalfNormal.of(v[0]);
            case "exponential":
                return Exponential.of(v[0]);
            default:
                throw new AssertionError(name);
        }
    }
}
