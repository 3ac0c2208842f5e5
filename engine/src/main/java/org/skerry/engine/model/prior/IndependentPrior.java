package org.skerry.engine.model.prior;

import java.util.Arrays;
import java.util.Collections;
import java.util.List;
import org.skerry.engine.model.Prior;
import org.skerry.engine.model.Support;
import org.skerry.engine.random.RandomStream;

/**
 * A prior under which the parameters are independent: the product of one univariate distribution
 * per coordinate, so the log-density is the sum of the marginal log-densities. Immutable.
 */
public final class IndependentPrior implements Prior {

    private final UnivariateDistribution[] marginals;

    private IndependentPrior(UnivariateDistribution[] marginals) {
        this.marginals = marginals;
    }

    /** @throws IllegalArgumentException if no marginal is given or one is null */
    public static IndependentPrior of(UnivariateDistribution... marginals) {
        return of(Arrays.asList(marginals));
    }

    /** @throws IllegalArgumentException if the list is empty or holds a null */
    public static IndependentPrior of(List<? extends UnivariateDistribution> marginals) {
        if (marginals.isEmpty()) {
            throw new IllegalArgumentException("marginals must not be empty");
        }
        UnivariateDistribution[] copy = marginals.toArray(new UnivariateDistribution[0]);
        for (int i = 0; i < copy.length; i++) {
            if (copy[i] == null) {
                throw new IllegalArgumentException("marginals[" + i + "] must not be null");
            }
        }
        return new IndependentPrior(copy);
    }

    /** The same distribution for each of {@code dimension} coordinates. */
    public static IndependentPrior iid(UnivariateDistribution marginal, int dimension) {
        if (dimension < 1) {
            throw new IllegalArgumentException("dimension must be >= 1, was " + dimension);
        }
        UnivariateDistribution[] copy = new UnivariateDistribution[dimension];
        Arrays.fill(copy, marginal);
        return of(copy);
    }

    @Override
    public int dimension() {
        return marginals.length;
    }

    /** The marginal distribution of coordinate {@code index}. */
    public UnivariateDistribution marginal(int index) {
        return marginals[index];
    }

    /** All marginals, in parameter order (unmodifiable). */
    public List<UnivariateDistribution> marginals() {
        return Collections.unmodifiableList(Arrays.asList(marginals));
    }

    /** The support of coordinate {@code index}. */
    public Support support(int index) {
        return marginals[index].support();
    }

    @Override
    public void sample(RandomStream random, double[] out) {
        for (int i = 0; i < marginals.length; i++) {
            out[i] = marginals[i].sample(random);
        }
    }

    @Override
    public double logDensity(double[] parameters) {
        double sum = 0.0;
        for (int i = 0; i < marginals.length; i++) {
            double term = marginals[i].logDensity(parameters[i]);
            if (term == Double.NEGATIVE_INFINITY) {
                return term;
            }
            sum += term;
        }
        return sum;
    }

    @Override
    public boolean equals(Object other) {
        return other instanceof IndependentPrior
                && Arrays.equals(marginals, ((IndependentPrior) other).marginals);
    }

    @Override
    public int hashCode() {
        return Arrays.hashCode(marginals);
    }

    @Override
    public String toString() {
        return "independent" + Arrays.toString(marginals);
    }
}
