package org.skerry.cli.report;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import org.skerry.cli.output.AtomicFile;

/**
 * Makes the report of a scaling study's folder in its {@code report/} folder: reads and checks
 * {@code study.conf} and {@code scaling.csv} first ({@link StudyReport#read}), so bad input
 * writes nothing; then the figures and, last, {@code index.html}.
 */
public final class StudyReportWriter {

    private StudyReportWriter() {
    }

    /**
     * Writes the report of the study folder {@code folder} and returns the page's path.
     *
     * @throws ReportInputException when the folder cannot be reported (nothing is written)
     * @throws IOException          when the report's files cannot be written
     */
    public static Path write(Path folder) throws IOException {
        FolderKind kind = FolderKind.of(folder);
        if (kind != FolderKind.STUDY) {
            throw new ReportInputException(folder + " is a " + kind.word() + " folder, not a study folder");
        }
        StudyReport study = StudyReport.read(folder);
        System.setProperty("java.awt.headless", "true");
        Path out = folder.resolve(ReportWriter.FOLDER);
        Files.createDirectories(out);
        ScalingFigures.Written figures = ScalingFigures.write(study, out);
        Path page = out.resolve(ReportWriter.PAGE);
        AtomicFile.writeString(page, StudyPage.of(study, figures));
        return page;
    }
}
