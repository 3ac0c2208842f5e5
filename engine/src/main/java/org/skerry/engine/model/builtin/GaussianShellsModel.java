package org.skerry.engine.model.builtin;

import java.util.Collections;
import org.skerry.engine.model.LikelihoodContext;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.ParameterSpace;
import org.skerry.engine.model.Prior;
import org.skerry.engine.model.Support;
import org.skerry.engine.model.prior.IndependentPrior;
import org.skerry.engine.model.prior.Uniform;

/**
 * The Gaussian shells problem of Feroz, Hobson &amp; Bridges, "MultiNest: an efficient and robust
 * Bayesian inference tool for cosmology and particle physics", MNRAS 398, 1601–1614 (2009), §6.2:
 * two thin spherical shells in D dimensions, each with likelihood
 * {@code exp(−(|θ − c|− r)²/(2w²))/√(2πw²)}, the total being their sum, under a uniform prior on
 * {@code [−bound, bound]^D}. The paper's settings are r = 2, w = 0.1, centres at ±3.5 on the
 * first axis, bound 6. Curved, thin, disconnected modes whose evidence falls fast with D.
 * Immutable and thread-safe.
 */
public final class GaussianShellsModel implements Model {

    private final ParameterSpace parameters;
    private final IndependentPrior prior;
    private final int dimension;
    private final double radius;
    private final double width;
    private final double centre;
    private final double bound;
    private final double logNormaliser;
    private final double halfPrecision;

    private GaussianShellsModel(int dimension, double radius, double width, double centre, double bound) {
        this.parameters = ParameterSpace.of(GaussianMixtureLikelihoodModel.names(dimension),
                Collections.nCopies(dimension, Support.interval(-bound, bound)));
        this.prior = IndependentPrior.iid(Uniform.of(-bound, bound), dimension);
        this.dimension = dimension;
        this.radius = radius;
        this.width = width;
        this.centre = centre;
        this.bound = bound;
        this.logNormaliser = -StrictMath.log(width) - 0.5 * StrictMath.log(2.0 * StrictMath.PI);
        this.halfPrecision = 0.5 / (width * width);
    }

    /** The published problem in {@code dimension} dimensions. */
    public static GaussianShellsModel standard(int dimension) {
        return of(dimension, 2.0, 0.1, 3.5, 6.0);
    }

    /**
     * @param dimension D ≥ 1
     * @param radius r, the shells' radius
     * @param width w, the shells' radial standard deviation
     * @param centre the shells are centred at (±centre, 0, …, 0)
     * @param bound the prior box is [−bound, bound] on every axis
     * @throws IllegalArgumentException on an out-of-range argument
     */
    public static GaussianShellsModel of(int dimension, double radius, double width, double centre,
            double bound) {
        if (dimension < 1) {
            throw new IllegalArgumentException("dimension must be >= 1, was " + dimension);
        }
        Data.positive("radius", radius);
        Data.positive("width", width);
        Data.finite("centre", centre);
        Data.positive("bound", bound);
        return new GaussianShellsModel(dimension, radius, width, centre, bound);
    }

    @Override
    public ParameterSpace parameters() {
        return parameters;
    }

    @Override
    public Prior prior() {
        return prior;
    }

    public double radius() {
        return radius;
    }

    public double width() {
        return width;
    }

    public double centre() {
        return centre;
    }

    public double bound() {
        return bound;
    }

    @Override
    public double logLikelihood(double[] theta, LikelihoodContext context) {
        // Both centres differ only on the first axis; the other axes are shared.
        double rest = 0.0;
        for (int k = 1; k < dimension; k++) {
            rest += theta[k] * theta[k];
        }
        double e1 = theta[0] - centre;
        double e2 = theta[0] + centre;
        double d1 = StrictMath.sqrt(e1 * e1 + rest) - radius;
        double d2 = StrictMath.sqrt(e2 * e2 + rest) - radius;
        return LogSum.of(logNormaliser - halfPrecision * d1 * d1, logNormaliser - halfPrecision * d2 * d2);
    }

    @Override
    public String toString() {
        return "gaussian-shells(D=" + dimension + ", radius=" + radius + ", width=" + width
                + ", centre=" + centre + ", bound=" + bound + ")";
    }
}
