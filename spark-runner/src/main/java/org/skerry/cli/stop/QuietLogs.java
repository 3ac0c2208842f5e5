package org.skerry.cli.stop;

import java.io.OutputStream;
import java.io.PrintStream;
import org.apache.logging.log4j.Level;
import org.apache.logging.log4j.LogManager;
import org.apache.logging.log4j.core.config.Configurator;

/**
 * Silences the libraries once the command has said why the process is ending: when a run is
 * abandoned, Spark logs every task and job that the shutdown cuts short, and its Scala futures
 * print the rejected ones' stack traces straight to standard error — tens of lines, none of them
 * about the run, burying the one that says what is kept and how to continue. The command's own
 * writer keeps the standard error stream it was made with, so nothing of ours is lost.
 */
final class QuietLogs {

    private QuietLogs() {
    }

    static void now() {
        try {
            Configurator.setAllLevels(LogManager.ROOT_LOGGER_NAME, Level.OFF);
        } catch (RuntimeException | LinkageError e) {
            // another logging backend on the class path: the stream below still goes quiet
        }
        System.setErr(new PrintStream(OutputStream.nullOutputStream(), true));
    }
}
