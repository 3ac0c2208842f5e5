package org.skerry.cli.batch;

import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.skerry.cli.output.BatchSummary;

/**
 * Fills in each row's log Bayes factor against the reference variant on the same dataset:
 * log B = log Ẑ(variant) − log Ẑ(reference), with error √(se² + se_ref²), the two runs being
 * independent (their seeds differ). Left NaN for the reference's own rows and where either
 * analysis has no evidence (failed or not yet run).
 */
public final class BayesFactors {

    private BayesFactors() {
    }

    /** {@code rows} with each non-reference row's log Bayes factor and its error filled in. */
    public static List<BatchSummary.Row> add(List<BatchSummary.Row> rows, String referenceVariant) {
        Map<String, BatchSummary.Row> reference = new HashMap<>();
        for (BatchSummary.Row r : rows) {
            if (r.variant().equals(referenceVariant)) {
                reference.put(r.dataset(), r);
            }
        }
        List<BatchSummary.Row> out = new ArrayList<>(rows.size());
        for (BatchSummary.Row r : rows) {
            BatchSummary.Row ref = reference.get(r.dataset());
            double factor = Double.NaN;
            double error = Double.NaN;
            if (ref != null && ref != r && !Double.isNaN(r.logEvidence()) && !Double.isNaN(ref.logEvidence())) {
                factor = r.logEvidence() - ref.logEvidence();
                error = Math.sqrt(r.logEvidenceError() * r.logEvidenceError()
                        + ref.logEvidenceError() * ref.logEvidenceError());
            }
            out.add(new BatchSummary.Row(r.dataset(), r.variant(), r.status(), r.logEvidence(), r.logEvidenceError(),
                    factor, error, r.iterations(), r.likelihoodEvaluations(), r.finalTolerance(), r.simulations(),
                    r.parameters(), r.seed(), r.folder(),
                    r.wallSeconds(), r.message()));
        }
        return out;
    }
}
