package org.skerry.cli.report;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.function.Supplier;
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

    /** Fits already simulated in this JVM, by run folder and the state of its files; a few dozen suffice. */
    private static final int REMEMBERED = 64;
    private static final Map<Key, PredictiveFit> MEMORY = Collections.synchronizedMap(
            new LinkedHashMap<>(16, 0.75f, true) {
                private static final long serialVersionUID = 1L;

                @Override
                protected boolean removeEldestEntry(Map.Entry<Key, PredictiveFit> eldest) {
                    return size() > REMEMBERED;
                }
            });

    /** A run folder's fit inputs as they are now: the same key means the same files, hence the same fit. */
    private record Key(Path folder, List<Long> stamps) {
        static Key of(Path folder, List<Path> files) throws IOException {
            List<Long> stamps = new ArrayList<>();
            for (Path file : files) {
                stamps.add(Files.size(file));
                stamps.add(Files.getLastModifiedTime(file).toMillis());
            }
            return new Key(folder.toAbsolutePath().normalize(), stamps);
        }
    }

    /**
     * The fit {@code compute} gives, or the one it gave earlier in this JVM for the same files of
     * {@code folder}: a batch's or the demo's report shows again the fits its runs' reports just
     * simulated, and the simulation (hundreds of model solves) is the report's costly part. The
     * fit is a function of the files and the seed, so a remembered one is the same numbers.
     */
    static PredictiveFit remembered(Path folder, List<Path> inputs, Supplier<PredictiveFit> compute) {
        Key key;
        try {
            key = Key.of(folder, inputs);
        } catch (IOException e) {
            return compute.get();
        }
        PredictiveFit known = MEMORY.get(key);
        if (known != null) {
            return known;
        }
        PredictiveFit fit = compute.get();
        MEMORY.put(key, fit);
        return fit;
    }

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
