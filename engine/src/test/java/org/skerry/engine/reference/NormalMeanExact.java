package org.skerry.engine.reference;

/**
 * Closed forms for the normal mean with known variance under a conjugate normal prior, one
 * coordinate at a time: yᵢ ~ N(μ, σ²), μ ~ N(μ₀, τ²), coordinates independent.
 *
 * <p>Posterior (Gelman et al., Bayesian Data Analysis, 3rd ed., §2.5, eqs. 2.11–2.12, and §3.5
 * for the multivariate case with diagonal covariances): precision {@code 1/τ² + n/σ²}, mean
 * {@code (μ₀/τ² + nȳ/σ²)/(1/τ² + n/σ²)}. Evidence (Bishop, Pattern Recognition and Machine
 * Learning (2006), §2.3.3, eq. 2.115, marginal of a linear-Gaussian model):
 * {@code y ~ N(μ₀·1, σ²I + τ²11ᵀ)}, evaluated with Commons Math's Cholesky decomposition; over d
 * independent coordinates the evidence is the product of the d marginals.
 *
 * <p>The likelihood of a run of observations is the density of the stacked values under
 * {@code N(μ, σ²I)}, evaluated by {@link Gaussians#logDensity} (Cholesky), not by summing
 * per-observation terms as the model does.
 */
public final class NormalMeanExact {

    private final double[][] rows;
    private final double sigma;
    private final double priorMean;
    private final double priorSd;

    /** @param rows n observations of d coordinates */
    public NormalMeanExact(double[][] rows, double sigma, double priorMean, double priorSd) {
        this.rows = rows;
        this.sigma = sigma;
        this.priorMean = priorMean;
        this.priorSd = priorSd;
    }

    public int dimension() {
        return rows[0].length;
    }

    private double sampleMean(int k) {
        double sum = 0.0;
        for (double[] row : rows) {
            sum += row[k];
        }
        return sum / rows.length;
    }

    /** The posterior variance of each coordinate. */
    public double posteriorVariance() {
        return 1.0 / (1.0 / (priorSd * priorSd) + rows.length / (sigma * sigma));
    }

    /** The posterior mean of coordinate k. */
    public double posteriorMean(int k) {
        return posteriorVariance() * (priorMean / (priorSd * priorSd) + rows.length * sampleMean(k) / (sigma * sigma));
    }

    /** The log evidence of coordinate k's n observations. */
    public double logEvidence(int k) {
        int n = rows.length;
        double[] y = SyntheticData.column(rows, k);
        double[] mean = new double[n];
        double[][] covariance = new double[n][n];
        for (int i = 0; i < n; i++) {
            mean[i] = priorMean;
            for (int j = 0; j < n; j++) {
                covariance[i][j] = priorSd * priorSd + (i == j ? sigma * sigma : 0.0);
            }
        }
        return Gaussians.logDensity(y, mean, covariance);
    }

    /** The log evidence of all the data: the sum over coordinates. */
    public double logEvidence() {
        double sum = 0.0;
        for (int k = 0; k < dimension(); k++) {
            sum += logEvidence(k);
        }
        return sum;
    }

    /** log N(y_from..y_{to−1}; μ, σ²I): rows {@code [from, to)} stacked into one vector. */
    public double logLikelihood(double[] mu, int from, int to) {
        int d = dimension();
        int size = (to - from) * d;
        double[] values = new double[size];
        double[] mean = new double[size];
        double[][] covariance = new double[size][size];
        for (int i = 0; i < size; i++) {
            values[i] = rows[from + i / d][i % d];
            mean[i] = mu[i % d];
            covariance[i][i] = sigma * sigma;
        }
        return Gaussians.logDensity(values, mean, covariance);
    }
}
