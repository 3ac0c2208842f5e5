package org.skerry.cli.report;

import java.io.IOException;
import java.io.InterruptedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import org.skerry.cli.output.AtomicFile;

/**
 * Makes the report of one run folder in its {@code report/} folder: reads and checks every file
 * first ({@link RunReport#read}), so bad input writes nothing, then writes the figures and, last,
 * {@code index.html} — each file atomically, so a page that exists has its figures.
 */
public final class ReportWriter {

    /** The report's folder inside the run folder. */
    public static final String FOLDER = "report";
    /** The page. */
    public static final String PAGE = "index.html";

    private ReportWriter() {
    }

    /**
     * Writes the report of {@code runFolder} and returns the page's path.
     *
     * @throws ReportInputException when the run folder cannot be reported (nothing is written)
     * @throws IOException          when the report's files cannot be written
     */
    public static Path write(Path runFolder) throws IOException {
        if (runFolder == null) {
            throw new IllegalArgumentException("runFolder must not be null");
        }
        return write(RunReport.read(runFolder));
    }

    /** Writes the report of a run already read and checked; returns the page's path. */
    static Path write(RunReport run) throws IOException {
        List<Warnings.Note> notes = Warnings.of(run);
        PairSelection pairs = PairSelection.of(run.values(), run.weights());
        System.setProperty("java.awt.headless", "true");
        Path folder = run.folder().resolve(FOLDER);
        Files.createDirectories(folder);
        // Two halves drawn at once: the figures are independent files, and drawing and PNG encoding
        // are most of a report's time (half of it in one thread at the end of the demo's runs).
        ExecutorService other = Executors.newSingleThreadExecutor(runnable -> {
            Thread thread = new Thread(runnable, "report-figures");
            thread.setDaemon(true);
            return thread;
        });
        List<PosteriorFigures.Figure> posteriors;
        FigureFile.Written pairFigure;
        FitFigures.Written fit;
        List<IterationFigures.Figure> iterations;
        try {
            Future<List<PosteriorFigures.Figure>> drawn = other.submit(() -> PosteriorFigures.write(run, folder));
            pairFigure = run.parameters().size() >= 2 ? PairFigure.write(run, pairs, folder) : null;
            fit = run.fit().available() ? FitFigures.write(run.fit(), folder) : null;
            iterations = IterationFigures.write(run, folder);
            posteriors = drawn.get();
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new InterruptedIOException("interrupted while drawing the report's figures");
        } catch (ExecutionException e) {
            Throwable cause = e.getCause();
            if (cause instanceof IOException io) {
                throw io;
            }
            if (cause instanceof RuntimeException runtime) {
                throw runtime;
            }
            throw new IllegalStateException(cause);
        } finally {
            other.shutdownNow();
        }
        Path page = folder.resolve(PAGE);
        AtomicFile.writeString(page, HtmlPage.of(run, notes, posteriors, pairs, pairFigure, fit, iterations));
        return page;
    }
}
