package org.skerry.engine.calibration;

import java.util.List;
import org.skerry.engine.model.Model;
import org.skerry.engine.model.builtin.BetaBinomialModel;
import org.skerry.engine.model.builtin.GaussianMixtureLikelihoodModel;
import org.skerry.engine.model.builtin.GaussianShellsModel;
import org.skerry.engine.model.builtin.LinearRegressionModel;
import org.skerry.engine.model.builtin.NormalMeanModel;
import org.skerry.engine.model.prior.MultivariateNormalPrior;
import org.skerry.engine.reference.BetaBinomialExact;
import org.skerry.engine.reference.GaussianMixtureExact;
import org.skerry.engine.reference.GaussianShellsExact;
import org.skerry.engine.reference.LinearRegressionExact;
import org.skerry.engine.reference.NormalMeanExact;
import org.skerry.engine.reference.SyntheticData;

/**
 * A model with a closed-form (or quadrature) log evidence and the population size it is run at:
 * the cases over which the single-run evidence error is checked for calibration.
 *
 * @param name         short label for tables
 * @param model        the model
 * @param particles    N
 * @param logEvidence  the exact log evidence (source named where each case is built)
 */
public record CalibrationCase(String name, Model model, int particles, double logEvidence) {

    /** 1-D normal mean, 5 points: BDA3 §2.5, PRML eq. 2.115. */
    public static CalibrationCase normalMeanSmall(int particles) {
        double[][] data = SyntheticData.normalRows(21, 5, new double[] {1.5}, 2.0);
        return new CalibrationCase("normal-mean 1-D, 5 points", NormalMeanModel.of(data, 2.0, 0.0, 3.0), particles,
                new NormalMeanExact(data, 2.0, 0.0, 3.0).logEvidence());
    }

    /** 1-D normal mean, 20 points: BDA3 §2.5, PRML eq. 2.115. */
    public static CalibrationCase normalMean(int particles) {
        double[][] data = SyntheticData.normalRows(11, 20, new double[] {1.5}, 2.0);
        return new CalibrationCase("normal-mean 1-D, 20 points", NormalMeanModel.of(data, 2.0, 0.0, 3.0), particles,
                new NormalMeanExact(data, 2.0, 0.0, 3.0).logEvidence());
    }

    /** 3-D normal mean, 15 points: BDA3 §3.5, PRML eq. 2.115. */
    public static CalibrationCase normalMean3(int particles) {
        double[][] data = SyntheticData.normalRows(12, 15, new double[] {-1.0, 0.5, 2.0}, 1.0);
        return new CalibrationCase("normal-mean 3-D", NormalMeanModel.of(data, 1.0, 0.0, 2.0), particles,
                new NormalMeanExact(data, 1.0, 0.0, 2.0).logEvidence());
    }

    /** Bayesian linear regression, 25 points: PRML §3.3 and eq. 3.86. */
    public static CalibrationCase linearRegression(int particles) {
        double[][] design = SyntheticData.design(13, 25, 2, -2.0, 2.0, true);
        double[] response = SyntheticData.regressionResponse(14, design, new double[] {0.7, -1.2}, 0.5);
        double[] priorMean = {0.0, 0.0};
        double[][] priorCovariance = {{4.0, 0.5}, {0.5, 2.0}};
        return new CalibrationCase("linear regression, 25 points",
                LinearRegressionModel.of(design, response, 0.5, MultivariateNormalPrior.of(priorMean, priorCovariance),
                        List.of("intercept", "slope")),
                particles, new LinearRegressionExact(design, response, 0.5, priorMean, priorCovariance).logEvidence());
    }

    /** Beta–Binomial, 17 of 40: BDA3 §2.4. */
    public static CalibrationCase betaBinomial(int particles) {
        return new CalibrationCase("beta-binomial", BetaBinomialModel.of(17, 40, 2.0, 3.0), particles,
                new BetaBinomialExact(17, 40, 2.0, 3.0).logEvidence());
    }

    /** Gaussian shells (Feroz, Hobson &amp; Bridges 2009), log Z by quadrature. */
    public static CalibrationCase shells(int dimension, int particles) {
        return new CalibrationCase("Gaussian shells D=" + dimension, GaussianShellsModel.standard(dimension), particles,
                GaussianShellsExact.logEvidence(dimension, 2.0, 0.1, 6.0));
    }

    /** Two normalised Gaussians as likelihood under a flat prior: log Z = −log(prior volume), exact by construction. */
    public static CalibrationCase mixture(int particles) {
        return new CalibrationCase("bimodal mixture 2-D",
                GaussianMixtureLikelihoodModel.of(2, 0.3, -3.0, 3.0, 0.5, 8.0), particles,
                new GaussianMixtureExact(0.3, new double[] {-3, -3}, new double[] {3, 3}, 0.5, 8.0).logEvidence());
    }

    @Override
    public String toString() {
        return name + ", N=" + particles;
    }
}
