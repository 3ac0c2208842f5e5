package org.skerry.cli.report;

import java.nio.file.Files;
import java.nio.file.Path;
import org.skerry.cli.output.BatchSummary;
import org.skerry.cli.output.RunConfFile;
import org.skerry.cli.output.SummaryJson;

/**
 * What kind of folder a report is asked for, told by the files it holds: a run ({@code
 * summary.json}, or {@code run.conf} alone for an unfinished one, which the run report refuses
 * with its own message), a batch ({@code batch-summary.json} with {@code batch.conf}), a
 * comparison ({@code batch-summary.json} alone: the demo's folder, a batch of one dataset under
 * its variants) or a scaling study ({@code scaling.csv} with {@code study.conf}). Anything else is
 * bad input naming the folder and what it lacks.
 */
public enum FolderKind {
    RUN("run"),
    BATCH("batch"),
    COMPARISON("comparison"),
    STUDY("study");

    /** The file a batch writes first; beside batch-summary.json it tells a batch from the demo's comparison. */
    static final String BATCH_STATE = "batch.conf";
    /** A study's table, one row per run. */
    static final String STUDY_TABLE = "scaling.csv";
    /** A study's resolved settings. */
    static final String STUDY_SETTINGS = "study.conf";

    private final String word;

    FolderKind(String word) {
        this.word = word;
    }

    /** The kind in a word, as messages and page titles use it. */
    public String word() {
        return word;
    }

    /**
     * The kind of {@code folder}.
     *
     * @throws ReportInputException when it does not exist, is not a folder, or is none of the kinds
     */
    public static FolderKind of(Path folder) {
        if (folder == null) {
            throw new IllegalArgumentException("folder must not be null");
        }
        if (!Files.exists(folder)) {
            throw new ReportInputException("folder " + folder + " does not exist");
        }
        if (!Files.isDirectory(folder)) {
            throw new ReportInputException(folder + " is not a folder (give a run, batch or study folder)");
        }
        if (Files.isRegularFile(folder.resolve(SummaryJson.FILE_NAME))) {
            return RUN;
        }
        if (Files.isRegularFile(folder.resolve(BatchSummary.JSON_NAME))) {
            return Files.isRegularFile(folder.resolve(BATCH_STATE)) ? BATCH : COMPARISON;
        }
        if (Files.isRegularFile(folder.resolve(STUDY_SETTINGS))) {
            if (!Files.isRegularFile(folder.resolve(STUDY_TABLE))) {
                throw new ReportInputException("study folder " + folder + " has no " + STUDY_TABLE
                        + ": the study has not finished (run skerry scale on its study file again to finish it)");
            }
            return STUDY;
        }
        if (Files.isRegularFile(folder.resolve(RunConfFile.FILE_NAME))) {
            return RUN; // an unfinished run: the run report says so and how to continue it
        }
        if (Files.isRegularFile(folder.resolve(BATCH_STATE))) {
            throw new ReportInputException("batch folder " + folder + " has no " + BatchSummary.JSON_NAME
                    + ": the batch has not started its analyses (run skerry batch on its batch file again)");
        }
        throw new ReportInputException(folder + " is not a run, batch or study folder: it holds no "
                + SummaryJson.FILE_NAME + " (a finished run), no " + BatchSummary.JSON_NAME
                + " (a batch, or the demo's comparison) and no " + STUDY_SETTINGS + " with " + STUDY_TABLE
                + " (a scaling study)");
    }
}
