package org.skerry.cli.report;

import java.util.ArrayList;
import java.util.List;

/**
 * What a reader must see before the numbers: an evidence error that cannot be trusted and why,
 * iterations whose MH steps reached the cap, invalid evaluations, and the final ESS as a share of
 * N. Each is a {@link Note}; a warning is something to act on, the others say what was checked.
 */
final class Warnings {

    /** One line of the warnings section. */
    record Note(boolean warning, String text) {
    }

    private Warnings() {
    }

    static List<Note> of(RunReport run) {
        SummaryFile s = run.summary();
        List<Note> notes = new ArrayList<>();
        if (s.isAbc()) {
            SummaryFile.Abc abc = s.abc();
            notes.add(new Note(true, "An ABC run: the posterior is the approximate one at tolerance "
                    + Readable.number(abc.finalTolerance()) + " on the scaled distance between simulated and "
                    + "observed summaries, not the exact posterior; it is only as informative as the summaries. "
                    + "No evidence is reported: summaries sufficient within each model are in general not "
                    + "sufficient for choosing between models (Robert, Cornuet, Marin & Pillai 2011)."));
            if (!abc.reachedFinalTolerance()) {
                notes.add(new Note(true, "The final tolerance was not reached"
                        + (abc.endedEarly() == null ? "." : ": " + abc.endedEarly() + ".")
                        + " The result is the ABC posterior at the tolerance reached, wider than asked for."));
            } else {
                notes.add(new Note(false, "The final tolerance asked for was reached."));
            }
        } else if (!s.errorReliable()) {
            notes.add(new Note(true, "The error of the log evidence is not reliable, so it is not shown"
                    + (s.errorWarning() == null ? "." : ": " + s.errorWarning())
                    + " Repeat the run with other seeds and use the spread of log Ẑ."));
        } else {
            notes.add(new Note(false, "The single-run error of the log evidence passed the run's own checks "
                    + "(multinomial resampling, a positive estimate, enough distinct ancestors)."));
        }
        if (s.iterationsAtStepCap() > 0) {
            notes.add(new Note(true, Readable.count(s.iterationsAtStepCap()) + " of " + Readable.count(s.iterations())
                    + " iterations reached the MH step cap"
                    + (run.maxSteps() > 0 ? " (" + run.maxSteps() + ")" : "") + ". "
                    + (s.stepCapWarning() == null ? "" : s.stepCapWarning())));
        } else {
            notes.add(new Note(false, "No iteration reached the MH step cap."));
        }
        if (s.invalidEvaluations() > 0) {
            notes.add(new Note(true, Readable.count(s.invalidEvaluations()) + " of "
                    + Readable.count(s.likelihoodEvaluations())
                    + (s.isAbc() ? " simulator evaluations" : " likelihood evaluations") + " were invalid (NaN, +∞ or an "
                    + "exception) and got zero weight; the posterior is conditional on where the model works."
                    + (s.firstInvalid() == null ? "" : " The first: " + s.firstInvalid() + ".")));
        } else {
            notes.add(new Note(false, s.isAbc() ? "No simulator evaluation was invalid." : "No likelihood evaluation was invalid."));
        }
        double ess = finalEss(run.weights());
        double share = ess / run.particles();
        String text = "Final ESS of the particles: " + Readable.number(ess) + " of N = " + Readable.count(run.particles())
                + " (" + Readable.percent(share) + "); " + Readable.count(s.distinctAncestorsAtEnd())
                + " distinct iteration-0 ancestors remain.";
        if (share < run.threshold()) {
            notes.add(new Note(true, text + " That is below the resampling threshold ("
                    + Readable.number(run.threshold()) + " of N): the weighted particles are worth few draws."));
        } else {
            notes.add(new Note(false, text));
        }
        return List.copyOf(notes);
    }

    /** (Σw)² / Σw² of the final weights. */
    static double finalEss(double[] weights) {
        double sum = 0;
        double squares = 0;
        for (double w : weights) {
            sum += w;
            squares += w * w;
        }
        return squares > 0 ? sum * sum / squares : 0;
    }
}
