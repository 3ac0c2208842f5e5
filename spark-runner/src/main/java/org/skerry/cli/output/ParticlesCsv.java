package org.skerry.cli.output;

import java.io.IOException;
import java.nio.file.Path;
import java.util.HashSet;
import java.util.List;
import java.util.Set;
import org.apache.commons.csv.CSVPrinter;
import org.skerry.engine.population.FinalParticles;

/**
 * Writes {@code particles.csv}: the final population, one row per particle in canonical order
 * (by global particle index), one column per parameter on the model's own scale, then
 * {@code weight}, the normalised weight (the weights sum to 1). Doubles are written by
 * {@link DoubleText}.
 */
public final class ParticlesCsv {

    /** The file's name in the run folder. */
    public static final String FILE_NAME = "particles.csv";

    /** The name of the weight column; no parameter may have it. */
    public static final String WEIGHT_COLUMN = "weight";

    private ParticlesCsv() {
    }

    /**
     * Writes {@code particles.csv} in {@code folder}, atomically.
     *
     * @param parameterNames    one distinct name per parameter, in parameter order
     * @param particles         the final particles, already in canonical order
     * @param normalisedWeights one weight per particle, summing to 1
     * @return the file written
     */
    public static Path write(Path folder, List<String> parameterNames, FinalParticles particles,
            double[] normalisedWeights) throws IOException {
        if (folder == null) {
            throw new IllegalArgumentException("folder must not be null");
        }
        if (particles == null) {
            throw new IllegalArgumentException("particles must not be null");
        }
        String[] header = header(parameterNames, particles.dimension());
        if (normalisedWeights == null || normalisedWeights.length != particles.size()) {
            throw new IllegalArgumentException("normalisedWeights must hold one weight per particle ("
                    + particles.size() + "), got " + (normalisedWeights == null ? "null" : normalisedWeights.length));
        }
        int d = particles.dimension();
        Path file = folder.resolve(FILE_NAME);
        AtomicFile.writeText(file, out -> {
            CSVPrinter printer = new CSVPrinter(out, CsvOutput.withHeader(header));
            String[] row = new String[d + 1];
            for (int i = 0; i < particles.size(); i++) {
                for (int k = 0; k < d; k++) {
                    row[k] = DoubleText.format(particles.value(i, k));
                }
                row[d] = DoubleText.format(normalisedWeights[i]);
                printer.printRecord((Object[]) row);
            }
            printer.flush();
        });
        return file;
    }

    private static String[] header(List<String> names, int dimension) {
        if (names == null || names.size() != dimension) {
            throw new IllegalArgumentException("parameterNames must hold one name per parameter (" + dimension
                    + "), got " + names);
        }
        Set<String> seen = new HashSet<>();
        String[] header = new String[dimension + 1];
        for (int k = 0; k < dimension; k++) {
            String name = names.get(k);
            if (name == null || name.isEmpty()) {
                throw new IllegalArgumentException("parameterNames[" + k + "] must not be empty, got " + names);
            }
            if (name.equals(WEIGHT_COLUMN)) {
                throw new IllegalArgumentException("parameter " + k + " is named '" + WEIGHT_COLUMN
                        + "', which is the name of the weight column");
            }
            if (!seen.add(name)) {
                throw new IllegalArgumentException("parameter name '" + name + "' appears twice in " + names);
            }
            header[k] = name;
        }
        header[dimension] = WEIGHT_COLUMN;
        return header;
    }
}
