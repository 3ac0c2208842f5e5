package org.skerry.cli.report;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.skerry.cli.output.AtomicFile;

/**
 * Makes the report of a batch folder, or of the demo's comparison folder, in its {@code report/}
 * folder: reads and checks {@code batch-summary.json} first ({@link BatchReport#read}), so bad
 * input writes nothing; then makes every succeeded analysis's own report where it is missing (the
 * page links to them), simulates the posterior predictive of each dataset's variants for the
 * side-by-side fits, writes the figures and, last, {@code index.html}.
 */
public final class BatchReportWriter {

    /**
     * What the runs contributed: per row (batch order) the address of its report from the batch's
     * report folder or null, its posterior predictive or null, and notes for the page.
     */
    record RunSide(String[] pages, PredictiveFit[] fits, List<Warnings.Note> notes) {
    }

    private BatchReportWriter() {
    }

    /**
     * Writes the report of {@code folder} (a batch or a comparison) and returns the page's path.
     *
     * @throws ReportInputException when the folder cannot be reported (nothing is written)
     * @throws IOException          when the report's files cannot be written
     */
    public static Path write(Path folder) throws IOException {
        FolderKind kind = FolderKind.of(folder);
        if (kind != FolderKind.BATCH && kind != FolderKind.COMPARISON) {
            throw new ReportInputException(folder + " is a " + kind.word() + " folder, not a batch folder");
        }
        BatchReport batch = BatchReport.read(folder, kind);
        System.setProperty("java.awt.headless", "true");
        Path out = folder.resolve(ReportWriter.FOLDER);
        Files.createDirectories(out);
        RunSide runs = runs(batch);
        BayesFactorFigure.Written factors = BayesFactorFigure.write(batch, out);
        List<ComparisonFitFigures.Written> fits = new ArrayList<>();
        List<String> fitNotes = new ArrayList<>();
        int index = 0;
        for (Map.Entry<String, List<BatchReport.Row>> dataset : batch.byDataset().entrySet()) {
            List<ComparisonFitFigures.Panel> panels = new ArrayList<>();
            List<String> missing = new ArrayList<>();
            for (BatchReport.Row row : dataset.getValue()) {
                PredictiveFit fit = runs.fits()[batch.rows().indexOf(row)];
                if (fit != null && fit.available()) {
                    panels.add(new ComparisonFitFigures.Panel(row, fit.summary()));
                } else if (fit != null) {
                    missing.add(row.variant() + ": " + fit.note());
                }
            }
            if (panels.size() >= 2) {
                fits.add(ComparisonFitFigures.write(dataset.getKey(), ++index, panels, out));
            } else if (!missing.isEmpty()) {
                fitNotes.add(dataset.getKey() + " — " + String.join("; ", missing));
            }
        }
        List<ForestFigures.Figure> forests = ForestFigures.write(batch, out);
        Path page = out.resolve(ReportWriter.PAGE);
        AtomicFile.writeString(page, BatchPage.of(batch, runs, factors, fits, fitNotes, forests));
        return page;
    }

    /**
     * Each succeeded analysis's report (made now where it is missing) and, for datasets with two
     * succeeded variants or more, its posterior predictive. A run that cannot be read is a note.
     */
    private static RunSide runs(BatchReport batch) {
        List<BatchReport.Row> rows = batch.rows();
        String[] pages = new String[rows.size()];
        PredictiveFit[] fits = new PredictiveFit[rows.size()];
        List<Warnings.Note> notes = new ArrayList<>();
        Map<String, List<BatchReport.Row>> byDataset = batch.byDataset();
        for (int i = 0; i < rows.size(); i++) {
            BatchReport.Row row = rows.get(i);
            if (!row.succeeded() || row.summary() == null) {
                continue;
            }
            Path runPage = row.runFolder().resolve(ReportWriter.FOLDER).resolve(ReportWriter.PAGE);
            boolean compare = byDataset.get(row.dataset()).stream().filter(r -> r.succeeded() && r.summary() != null)
                    .count() >= 2;
            boolean makePage = !Files.isRegularFile(runPage);
            if (makePage || compare) {
                try {
                    RunReport run = RunReport.read(row.runFolder());
                    if (makePage) {
                        ReportWriter.write(run);
                    }
                    if (compare) {
                        fits[i] = run.fit();
                    }
                } catch (IOException | RuntimeException e) {
                    notes.add(new Warnings.Note(true, row.dataset() + "/" + row.variant() + ": its run report could "
                            + "not be made or read (" + e.getMessage() + "); make it with skerry report "
                            + row.runFolder()));
                }
            }
            if (Files.isRegularFile(runPage)) {
                pages[i] = PageParts.address("../" + row.relative() + "/" + ReportWriter.FOLDER + "/"
                        + ReportWriter.PAGE);
            }
        }
        return new RunSide(pages, fits, notes);
    }
}
