package org.skerry.cli.report;

import java.util.List;
import org.skerry.engine.model.PredictiveModel;
import org.skerry.engine.model.predictive.PosteriorPredictive;
import org.skerry.engine.model.predictive.PredictiveSummary;

/**
 * The fit against the data: the posterior predictive of the observed data from
 * {@link PosteriorPredictive#DEFAULT_DRAWS} weighted draws of the final particles (Gelman, Meng
 * &amp; Stern 1996, Statistica Sinica 6), when the model, built again from {@code run.conf},
 * offers predictions; otherwise a note that says why there is none.
 *
 * @param summary the predictive summary per observation, or null
 * @param note    why there is no fit figure; null when there is one
 */
record PredictiveFit(PredictiveSummary summary, String note) {

    boolean available() {
        return summary != null;
    }

    static PredictiveFit of(RebuiltModel rebuilt, List<String> parameters, List<double[]> values,
            double[] weights, long seed) {
        if (rebuilt.model() == null) {
            return none(rebuilt.note());
        }
        if (!(rebuilt.model() instanceof PredictiveModel predictive)) {
            return none("model " + rebuilt.label() + " offers no predictions of its data");
        }
        int d = parameters.size();
        int n = weights.length;
        double[] vectors = new double[n * d];
        for (int i = 0; i < n; i++) {
            for (int k = 0; k < d; k++) {
                vectors[i * d + k] = values.get(k)[i];
            }
        }
        try {
            return new PredictiveFit(PosteriorPredictive.summarise(predictive, vectors, n, weights,
                    PosteriorPredictive.DEFAULT_DRAWS, seed), null);
        } catch (RuntimeException e) {
            return none("the posterior predictive could not be simulated: " + e.getMessage());
        }
    }

    private static PredictiveFit none(String why) {
        return new PredictiveFit(null, why);
    }
}
