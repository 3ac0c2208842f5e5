package org.skerry.cli;

import java.util.List;
import org.skerry.engine.model.LikelihoodContext;
import org.skerry.engine.model.ParameterSpace;
import org.skerry.engine.model.Prior;
import org.skerry.engine.model.SummarySimulator;
import org.skerry.engine.model.Support;
import org.skerry.engine.model.prior.IndependentPrior;
import org.skerry.engine.model.prior.Normal;

/** Simulators that get their summaries wrong, for the ABC run tests' bad input (run-file model.class). */
public final class AbcTestSimulators {

    private AbcTestSimulators() {
    }

    /** Base: one parameter mu ~ N(0, 1); summaries "a" and "b". */
    abstract static class Base implements SummarySimulator {
        @Override
        public ParameterSpace parameters() {
            return ParameterSpace.of(List.of("mu"), List.of(Support.real()));
        }

        @Override
        public Prior prior() {
            return IndependentPrior.of(Normal.of(0, 1));
        }

        @Override
        public double logLikelihood(double[] parameters, LikelihoodContext context) {
            throw new UnsupportedOperationException("no likelihood");
        }

        @Override
        public List<String> summaryNames() {
            return List.of("a", "b");
        }

        @Override
        public double[] observedSummaries() {
            return new double[] {0.1, 0.2};
        }
    }

    /** Names two summaries and writes three. */
    public static final class TooMany extends Base {
        @Override
        public void simulate(double[] parameters, LikelihoodContext context, double[] summaries) {
            for (int k = 0; k < 3; k++) {
                summaries[k] = parameters[0] + context.random().nextNormal();
            }
        }
    }

    /** Summary "b" is always 1: it has no spread. */
    public static final class Constant extends Base {
        @Override
        public void simulate(double[] parameters, LikelihoodContext context, double[] summaries) {
            summaries[0] = parameters[0] + context.random().nextNormal();
            summaries[1] = 1.0;
        }
    }

    /** A fine simulator with no observed summaries of its own. */
    public static final class NoData extends Base {
        @Override
        public void simulate(double[] parameters, LikelihoodContext context, double[] summaries) {
            summaries[0] = parameters[0] + context.random().nextNormal();
            summaries[1] = parameters[0] * parameters[0] + 0.5 * context.random().nextNormal();
        }

        @Override
        public double[] observedSummaries() {
            return null;
        }
    }

    /** Two coins (0 or 1 each) against observed 0.5 and 0.5: every distance is the same, so the tolerance stalls. */
    public static final class Coins extends Base {
        @Override
        public void simulate(double[] parameters, LikelihoodContext context, double[] summaries) {
            for (int k = 0; k < 2; k++) {
                summaries[k] = parameters[0] + context.random().nextNormal() > 0 ? 1.0 : 0.0;
            }
        }

        @Override
        public double[] observedSummaries() {
            return new double[] {0.5, 0.5};
        }
    }
}
