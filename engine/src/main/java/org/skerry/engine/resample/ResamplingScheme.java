package org.skerry.engine.resample;

/**
 * How offspring counts are drawn from normalised weights. Every scheme is unbiased (the expected
 * number of copies of particle {@code i} is {@code N * W_i}) and gives exactly {@code N}
 * offspring; they differ in the variance they add. Douc, Cappé &amp; Moulines (2005),
 * "Comparison of resampling schemes for particle filtering", ISPA 2005, compare all four.
 */
public enum ResamplingScheme {
    /**
     * {@code N} independent draws from the weights, made sorted through exponential spacings
     * (Devroye 1986, <i>Non-Uniform Random Variate Generation</i>, ch. V).
     */
    MULTINOMIAL,
    /** One uniform point in each of the {@code N} strata of [0, 1) (Kitagawa 1996, JCGS 5(1)). */
    STRATIFIED,
    /**
     * {@code N} evenly spaced points with one shared random offset (Kitagawa 1996; Carpenter,
     * Clifford &amp; Fearnhead 1999, IEE Proc. Radar, Sonar and Navigation 146(1)).
     */
    SYSTEMATIC,
    /**
     * {@code floor(N W_i)} copies for certain, the remaining points multinomial on the fractional
     * parts (Liu &amp; Chen 1998, JASA 93(443)).
     */
    RESIDUAL
}
