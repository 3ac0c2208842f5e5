package org.skerry.engine.sampler;

/**
 * Weighted posterior summary of one parameter: mean, standard deviation and quantiles, on the
 * model's own scale. Quantiles are the inverse of the weighted empirical distribution function
 * (the smallest particle value whose cumulative normalised weight reaches the probability).
 * A quantile is named after its percentage, the decimal point written as {@code _}:
 * {@code q2_5} is the 2.5 % quantile, {@code q50} the median, as in the output files.
 *
 * @param name  parameter name
 * @param mean  weighted mean
 * @param sd    weighted standard deviation
 * @param q2_5  2.5 % quantile
 * @param q5    5 % quantile
 * @param q25   25 % quantile
 * @param q50   median (50 % quantile)
 * @param q75   75 % quantile
 * @param q95   95 % quantile
 * @param q97_5 97.5 % quantile
 */
public record ParameterSummary(String name, double mean, double sd, double q2_5, double q5, double q25,
        double q50, double q75, double q95, double q97_5) {
}
