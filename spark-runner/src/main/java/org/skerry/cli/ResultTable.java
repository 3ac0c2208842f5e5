package org.skerry.cli;

import java.io.PrintWriter;
import java.util.Locale;
import org.skerry.engine.sampler.EvidenceEstimate;
import org.skerry.engine.sampler.ParameterSummary;
import org.skerry.engine.sampler.SamplerResult;
import org.skerry.engine.sampler.ToleranceRecord;

/** The short result table printed at the end of a run. */
final class ResultTable {

    private ResultTable() {
    }

    static void print(Analysis.Outcome outcome, PrintWriter out) {
        SamplerResult result = outcome.result();
        EvidenceEstimate evidence = result.evidence();
        out.println("run folder: " + outcome.folder());
        ToleranceRecord abc = result.lastTolerance();
        if (abc != null) {
            out.println(String.format(Locale.ROOT, "ABC: tolerance %.6g reached, %d simulations; evidence not reported "
                    + "(see summary.json)", abc.tolerance(), result.simulations()));
            if (result.endedEarly() != null) {
                out.println("  warning: the run ended early: " + result.endedEarly()
                        + "; the result is kept and is the ABC posterior at the tolerance reached");
            }
        } else if (evidence.reliable()) {
            out.println(String.format(Locale.ROOT, "log evidence: %.4f ± %.4f (single-run estimate)",
                    evidence.logEvidence(), evidence.standardError()));
        } else {
            out.println(String.format(Locale.ROOT, "log evidence: %.4f, no trustworthy single-run error", evidence.logEvidence()));
            out.println("  warning: " + evidence.warning());
        }
        if (result.stepCap().warning() != null) {
            out.println("  warning: " + result.stepCap().warning());
        }
        out.println(String.format(Locale.ROOT, "iterations: %d, %s: %d, invalid: %d, wall time: %.1f s",
                result.iterationCount(), abc != null ? "simulator evaluations" : "likelihood evaluations",
                result.evaluations().evaluations(), result.evaluations().invalid(),
                outcome.wallSeconds()));
        int width = 9;
        for (ParameterSummary p : result.parameters()) {
            width = Math.max(width, p.name().length());
        }
        out.println(String.format(Locale.ROOT, "%-" + width + "s %12s %12s %12s %12s", "parameter", "mean", "sd",
                "2.5 %", "97.5 %"));
        for (ParameterSummary p : result.parameters()) {
            out.println(String.format(Locale.ROOT, "%-" + width + "s %12.5g %12.5g %12.5g %12.5g", p.name(), p.mean(),
                    p.sd(), p.q2_5(), p.q97_5()));
        }
    }
}
