package org.skerry.engine.sampler;

/**
 * Weighted posterior summary of one parameter: mean, standard deviation and quantiles, on the
 * model's own scale. Quantiles are the inverse of the weighted empirical distribution function
 * (the smallest particle value whose cumulative normalised weight reaches the probability).
 *
 * @param name parameter name
 * @param mean weighted mean
 * @param sd   weighted standard deviation
 * @param q025 2.5 % quantile
 * @param q050 5 % quantile
 * @param q250 25 % quantile
 * @param q500 median
 * @param q750 75 % quantile
 * @param q950 95 % quantile
 * @param q975 97.5 % quantile
 */
public record ParameterSummary(String name, double mean, double sd, double q025, double q050, double q250,
        double q500, double q750, double q950, double q975) {
}
