package org.skerry.engine.model.builtin;

import java.util.Arrays;
import java.util.Collections;
import java.util.List;
import org.skerry.engine.model.LikelihoodContext;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.ParameterSpace;
import org.skerry.engine.model.Prior;
import org.skerry.engine.model.Support;
import org.skerry.engine.model.prior.IndependentPrior;
import org.skerry.engine.model.prior.Uniform;

/**
 * A bimodal test problem: the likelihood is itself a normalised two-component normal mixture in
 * θ, {@code w·N(θ; m₁, s²I) + (1 − w)·N(θ; m₂, s²I)}, under a uniform prior on the box
 * {@code [−bound, bound]^D}. Because the likelihood integrates to one over the whole space, the
 * evidence is {@code (mass inside the box)/(2·bound)^D}, which is {@code −D·log(2·bound)} in logs
 * when the box holds essentially all of both components; the posterior is the mixture truncated
 * to the box, so a sampler must find both modes with weights w and 1 − w. Immutable and
 * thread-safe.
 */
public final class GaussianMixtureLikelihoodModel implements Model {

    private final ParameterSpace parameters;
    private final IndependentPrior prior;
    private final double weight;
    private final double[] mean1;
    private final double[] mean2;
    private final double sd;
    private final double bound;
    private final double logComponent1;
    private final double logComponent2;
    private final double halfPrecision;

    private GaussianMixtureLikelihoodModel(double weight, double[] mean1, double[] mean2, double sd,
            double bound) {
        int d = mean1.length;
        this.parameters = ParameterSpace.of(names(d), Collections.nCopies(d,
                Support.interval(-bound, bound)));
        this.prior = IndependentPrior.iid(Uniform.of(-bound, bound), d);
        this.weight = weight;
        this.mean1 = mean1;
        this.mean2 = mean2;
        this.sd = sd;
        this.bound = bound;
        double logNormal = -d * (StrictMath.log(sd) + 0.5 * StrictMath.log(2.0 * StrictMath.PI));
        this.logComponent1 = StrictMath.log(weight) + logNormal;
        this.logComponent2 = StrictMath.log1p(-weight) + logNormal;
        this.halfPrecision = 0.5 / (sd * sd);
    }

    static List<String> names(int d) {
        return ParameterSpace.real("theta", d).names();
    }

    /**
     * @param weight w, the first component's share, in (0, 1)
     * @param mean1 m₁ (its length is the dimension D)
     * @param mean2 m₂, same length
     * @param sd s, both components' standard deviation
     * @param bound the prior box is [−bound, bound] on every axis
     * @throws IllegalArgumentException on an out-of-range or mismatched argument
     */
    public static GaussianMixtureLikelihoodModel of(double weight, double[] mean1, double[] mean2,
            double sd, double bound) {
        if (!(weight > 0.0 && weight < 1.0)) {
            throw new IllegalArgumentException("weight must be in (0, 1), was " + weight);
        }
        if (mean1.length == 0 || mean1.length != mean2.length) {
            throw new IllegalArgumentException("mean1 and mean2 must have the same non-zero length, had "
                    + mean1.length + " and " + mean2.length);
        }
        Data.requireFinite("means", new double[][] {mean1, mean2});
        Data.positive("sd", sd);
        Data.positive("bound", bound);
        return new GaussianMixtureLikelihoodModel(weight, mean1.clone(), mean2.clone(), sd, bound);
    }

    /** Component means at {@code location1·1} and {@code location2·1} in D dimensions. */
    public static GaussianMixtureLikelihoodModel of(int dimension, double weight, double location1,
            double location2, double sd, double bound) {
        if (dimension < 1) {
            throw new IllegalArgumentException("dimension must be >= 1, was " + dimension);
        }
        double[] m1 = new double[dimension];
        double[] m2 = new double[dimension];
        Arrays.fill(m1, location1);
        Arrays.fill(m2, location2);
        return of(weight, m1, m2, sd, bound);
    }

    @Override
    public ParameterSpace parameters() {
        return parameters;
    }

    @Override
    public Prior prior() {
        return prior;
    }

    public double weight() {
        return weight;
    }

    public double[] mean1() {
        return mean1.clone();
    }

    public double[] mean2() {
        return mean2.clone();
    }

    public double sd() {
        return sd;
    }

    public double bound() {
        return bound;
    }

    @Override
    public double logLikelihood(double[] theta, LikelihoodContext context) {
        double q1 = 0.0;
        double q2 = 0.0;
        for (int k = 0; k < mean1.length; k++) {
            double e1 = theta[k] - mean1[k];
            double e2 = theta[k] - mean2[k];
            q1 += e1 * e1;
            q2 += e2 * e2;
        }
        return LogSum.of(logComponent1 - halfPrecision * q1, logComponent2 - halfPrecision * q2);
    }

    @Override
    public String toString() {
        return "gaussian-mixture(D=" + mean1.length + ", weight=" + weight + ", sd=" + sd
                + ", bound=" + bound + ")";
    }
}
