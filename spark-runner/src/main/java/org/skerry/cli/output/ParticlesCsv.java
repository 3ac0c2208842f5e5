package org.skerry.cli.output;

import java.io.IOException;
import java.nio.file.Path;
import java.util.HashSet;
import java.util.List;
import java.util.Set;
import org.apache.commons.csv.CSVPrinter;
import org.skerry.engine.population.FinalParticles;
import org.skerry.engine.population.ParticleRows;

/**
 * Writes {@code particles.csv}: the final population, one row per particle in canonical order
 * (by global particle index), one column per parameter on the model's own scale, then
 * {@code weight}, the normalised weight (the weights sum to 1), {@code log_likelihood}, the
 * particle's untempered log-likelihood, and {@code log_prior}, the prior's normalised log-density
 * at it — both as the sampler computed them when the particle was drawn or last moved (so
 * {@code -Infinity} where the model returned a zero or an invalid value), carried with the
 * particle through resampling; every backend and partitioning writes the same bytes. Doubles
 * are written by {@link DoubleText}. Rows are written as they stream past ({@link ParticleWriter});
 * the file gets its name only when {@link #finish} publishes it.
 */
public final class ParticlesCsv implements ParticleWriter {

    /** The file's name in the run folder. */
    public static final String FILE_NAME = "particles.csv";

    /** The name of the weight column; no parameter may have it. */
    public static final String WEIGHT_COLUMN = "weight";
    /** The name of the log-likelihood column; no parameter may have it. */
    public static final String LOG_LIKELIHOOD_COLUMN = "log_likelihood";
    /** The name of the log-prior column; no parameter may have it. */
    public static final String LOG_PRIOR_COLUMN = "log_prior";

    /** The columns after the parameters, in order. */
    static final List<String> FIXED_COLUMNS = List.of(WEIGHT_COLUMN, LOG_LIKELIHOOD_COLUMN, LOG_PRIOR_COLUMN);

    private final StreamedFile file;
    private final CSVPrinter printer;
    private final int dimension;
    private final String[] row;
    private long next;

    private ParticlesCsv(StreamedFile file, String[] header, int dimension) throws IOException {
        this.file = file;
        this.printer = new CSVPrinter(file.writer(), CsvOutput.withHeader(header));
        this.dimension = dimension;
        this.row = new String[dimension + FIXED_COLUMNS.size()];
    }

    /**
     * Starts {@code particles.csv} in {@code folder} (its header written to a temporary file).
     *
     * @param parameterNames one distinct name per parameter, in parameter order
     * @param dimension      parameters a particle
     */
    public static ParticlesCsv open(Path folder, List<String> parameterNames, int dimension) throws IOException {
        if (folder == null) {
            throw new IllegalArgumentException("folder must not be null");
        }
        String[] header = header(parameterNames, dimension);
        StreamedFile file = new StreamedFile(folder.resolve(FILE_NAME));
        try {
            return new ParticlesCsv(file, header, dimension);
        } catch (IOException | RuntimeException e) {
            file.close();
            throw e;
        }
    }

    @Override
    public void append(ParticleRows rows) throws IOException {
        if (rows.dimension() != dimension) {
            throw new IllegalArgumentException("rows of dimension " + rows.dimension() + " for a file of " + dimension
                    + " parameters");
        }
        if (rows.firstIndex() != next) {
            throw new IllegalArgumentException("rows start at particle " + rows.firstIndex() + ", expected " + next);
        }
        int d = dimension;
        double[] values = rows.values();
        double[] weights = rows.weights();
        double[] logLikelihood = rows.logLikelihood();
        double[] logPrior = rows.logPrior();
        for (int i = 0; i < rows.count(); i++) {
            for (int k = 0; k < d; k++) {
                row[k] = DoubleText.format(values[i * d + k]);
            }
            row[d] = DoubleText.format(weights[i]);
            row[d + 1] = DoubleText.format(logLikelihood[i]);
            row[d + 2] = DoubleText.format(logPrior[i]);
            printer.printRecord((Object[]) row);
        }
        next += rows.count();
    }

    @Override
    public Path finish() throws IOException {
        printer.flush();
        return file.publish();
    }

    @Override
    public void close() throws IOException {
        file.close();
    }

    /**
     * Writes {@code particles.csv} in {@code folder} from a population held whole, atomically.
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
        header(parameterNames, particles.dimension());
        if (normalisedWeights == null || normalisedWeights.length != particles.size()) {
            throw new IllegalArgumentException("normalisedWeights must hold one weight per particle ("
                    + particles.size() + "), got " + (normalisedWeights == null ? "null" : normalisedWeights.length));
        }
        try (ParticlesCsv csv = open(folder, parameterNames, particles.dimension())) {
            csv.append(new ParticleRows(0, particles.size(), particles.dimension(), particles.values(), normalisedWeights,
                    particles.logLikelihood(), particles.logPrior()));
            return csv.finish();
        }
    }

    /**
     * Checks that {@code names} can head the parameter columns: distinct, not empty, and none of
     * them the name of a column that follows ({@link #FIXED_COLUMNS}). A run checks this before it
     * starts, so that a model whose names clash fails at once rather than after the run.
     *
     * @throws IllegalArgumentException naming the offending name
     */
    public static void checkParameterNames(List<String> names) {
        if (names == null) {
            throw new IllegalArgumentException("parameterNames must not be null");
        }
        header(names, names.size());
    }

    private static String[] header(List<String> names, int dimension) {
        if (names == null || names.size() != dimension) {
            throw new IllegalArgumentException("parameterNames must hold one name per parameter (" + dimension
                    + "), got " + names);
        }
        Set<String> seen = new HashSet<>();
        String[] header = new String[dimension + FIXED_COLUMNS.size()];
        for (int k = 0; k < dimension; k++) {
            String name = names.get(k);
            if (name == null || name.isEmpty()) {
                throw new IllegalArgumentException("parameterNames[" + k + "] must not be empty, got " + names);
            }
            if (FIXED_COLUMNS.contains(name)) {
                throw new IllegalArgumentException("parameter " + k + " is named '" + name
                        + "', which is the name of a column of " + FILE_NAME + " " + FIXED_COLUMNS);
            }
            if (!seen.add(name)) {
                throw new IllegalArgumentException("parameter name '" + name + "' appears twice in " + names);
            }
            header[k] = name;
        }
        for (int c = 0; c < FIXED_COLUMNS.size(); c++) {
            header[dimension + c] = FIXED_COLUMNS.get(c);
        }
        return header;
    }
}
