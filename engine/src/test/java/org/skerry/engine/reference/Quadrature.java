package org.skerry.engine.reference;

import java.util.function.DoubleBinaryOperator;
import java.util.function.DoubleUnaryOperator;
import org.apache.commons.math3.analysis.integration.IterativeLegendreGaussIntegrator;
import org.apache.commons.math3.analysis.integration.gauss.GaussIntegrator;
import org.apache.commons.math3.analysis.integration.gauss.GaussIntegratorFactory;

/**
 * Numerical integration for the closed-form checks, on Commons Math's Legendre–Gauss rules:
 * adaptive one-dimensional integrals, nested two-dimensional ones, and fixed composite tensor
 * rules for integrands with thin features (the shells) that an adaptive outer loop would resolve
 * only slowly.
 */
public final class Quadrature {

    private static final GaussIntegratorFactory FACTORY = new GaussIntegratorFactory();

    private Quadrature() {
    }

    /** Adaptive ∫ f over [lower, upper] to relative accuracy {@code relative}. */
    public static double integrate(DoubleUnaryOperator f, double lower, double upper, double relative) {
        IterativeLegendreGaussIntegrator integrator = new IterativeLegendreGaussIntegrator(8, relative, 1e-300);
        return integrator.integrate(Integer.MAX_VALUE, f::applyAsDouble, lower, upper);
    }

    /** Adaptive nested ∫∫ f(x, y) dy dx over a rectangle. */
    public static double integrate(DoubleBinaryOperator f, double xLower, double xUpper, double yLower,
            double yUpper, double relative) {
        return integrate(x -> integrate(y -> f.applyAsDouble(x, y), yLower, yUpper, relative),
                xLower, xUpper, relative);
    }

    /** ∫∫ f over the square [lower, upper]² with {@code panels} equal panels per axis of an {@code order}-point rule. */
    public static double square(DoubleBinaryOperator f, double lower, double upper, int panels, int order) {
        double[] nodes = new double[panels * order];
        double[] weights = new double[panels * order];
        double width = (upper - lower) / panels;
        for (int p = 0; p < panels; p++) {
            GaussIntegrator rule = FACTORY.legendre(order, lower + p * width, lower + (p + 1) * width);
            for (int i = 0; i < order; i++) {
                nodes[p * order + i] = rule.getPoint(i);
                weights[p * order + i] = rule.getWeight(i);
            }
        }
        double sum = 0.0;
        for (int i = 0; i < nodes.length; i++) {
            double row = 0.0;
            for (int j = 0; j < nodes.length; j++) {
                row += weights[j] * f.applyAsDouble(nodes[i], nodes[j]);
            }
            sum += weights[i] * row;
        }
        return sum;
    }
}
