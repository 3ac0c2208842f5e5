package org.skerry.engine.model;

import org.skerry.engine.random.RandomStream;

/**
 * A model that can simulate new data like its observed data at given parameters: what a
 * posterior predictive check needs, the observed values set against replicates drawn from
 * {@code p(y_rep | θ)} at posterior draws θ (Gelman, Meng &amp; Stern 1996, "Posterior predictive
 * assessment of model fitness via realized discrepancies", Statistica Sinica 6, 733–807). An
 * optional capability: {@link #of(Model)} finds it on a model or refuses.
 *
 * <p>The observed values are numbered {@code 0 .. observedCount()-1} in one fixed order that
 * the model documents (time order for a series, data-file row order otherwise); a replicate
 * holds one simulated value for each, in the same order. Each value may have a position on an
 * x-axis ({@link #positions()}: the day of a series); by default its row number.
 *
 * <p>The contract, which every implementation keeps:
 * <ul>
 *   <li><b>Keyed randomness.</b> {@link #replicate} draws only from the stream it is handed,
 *       starting where the stream stands, in an order that depends on nothing but the
 *       parameters, and keeps nothing between calls: a stream at the same address gives the
 *       same replicate, bit for bit. The caller keys the stream (purpose {@code PREDICTIVE}).</li>
 *   <li><b>The likelihood's noise model.</b> A replicate is a draw from the very distribution
 *       {@link Model#logLikelihood} is the density of.</li>
 *   <li><b>Thread-safety as for {@link Model}:</b> called from many threads at once; it must not
 *       keep or change the parameter array.</li>
 * </ul>
 *
 * <p>A model that wraps another model must implement this interface itself and forward it, or
 * the capability is lost.
 */
public interface PredictiveModel extends Model {

    /** The number of observed values, at least 1. */
    int observedCount();

    /** The observed values, in the model's order (a fresh array of {@link #observedCount()} values). */
    double[] observedValues();

    /** What the observed values measure. */
    Quantity observedQuantity();

    /**
     * Each observed value's position on the x-axis of a figure (a fresh array of
     * {@link #observedCount()} values): by default the row number {@code 0, 1, 2, …}.
     */
    default double[] positions() {
        double[] rows = new double[observedCount()];
        for (int j = 0; j < rows.length; j++) {
            rows[j] = j;
        }
        return rows;
    }

    /** What the positions measure: by default {@link Quantity#ROW}. */
    default Quantity positionQuantity() {
        return Quantity.ROW;
    }

    /**
     * Writes one replicate data set drawn at {@code parameters} into
     * {@code out[0 .. observedCount())}, drawing only from {@code random}.
     *
     * @throws IllegalArgumentException if {@code out} holds fewer than {@link #observedCount()} values
     */
    void replicate(double[] parameters, RandomStream random, double[] out);

    /**
     * {@code model} as a {@code PredictiveModel}.
     *
     * @throws IllegalArgumentException naming the model if it cannot simulate replicate data
     */
    static PredictiveModel of(Model model) {
        if (model == null) {
            throw new IllegalArgumentException("model must not be null");
        }
        if (model instanceof PredictiveModel) {
            return (PredictiveModel) model;
        }
        throw new IllegalArgumentException("model " + describe(model) + " cannot simulate replicate data: "
                + "a fit against the data (posterior predictive bands and residuals) needs a model that implements "
                + PredictiveModel.class.getName());
    }

    /**
     * Fails unless {@code out} holds at least {@code count} values; for implementations of
     * {@link #replicate}.
     *
     * @throws IllegalArgumentException naming the array and the count
     */
    static void checkReplicate(double[] out, int count) {
        if (out == null || out.length < count) {
            throw new IllegalArgumentException("out must hold " + count + " values for a replicate, was "
                    + (out == null ? "null" : "of length " + out.length));
        }
    }

    private static String describe(Model model) {
        String type = model.getClass().getName();
        String text = String.valueOf(model);
        return text.startsWith(type + "@") ? type : "'" + text + "' (" + type + ")";
    }
}
