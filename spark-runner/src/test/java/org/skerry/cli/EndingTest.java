package org.skerry.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.skerry.cli.runfile.RunFileException;
import org.skerry.engine.settings.SettingsException;

/** {@link Ending}: the one mapping from an exception to an exit code and what is printed. */
class EndingTest {

    @Test
    @DisplayName("bad input from the command line or the settings reader is exit 2, without a trace")
    void badInput() {
        for (RuntimeException e : List.of(new RunFileException("run.conf: line 3: x = 1: no"),
                new SettingsException("run.conf: line 3: x = 1: no"))) {
            Ending ending = Ending.of(e);
            assertEquals(ExitCodes.BAD_INPUT, ending.exitCode());
            assertEquals("bad input: run.conf: line 3: x = 1: no", ending.summary());
            assertEquals(List.of(ending.summary()), ending.lines());
            assertFalse(ending.trace());
        }
    }

    @Test
    @DisplayName("a run that ended in a known way keeps its code; anything unexpected is exit 1 with a trace")
    void runFailures() {
        Ending stopped = Ending.of(new RunEnded(ExitCodes.STOPPED_RESUMABLE, "stopped", null));
        assertEquals(ExitCodes.STOPPED_RESUMABLE, stopped.exitCode());
        assertEquals("stopped", stopped.summary());
        Ending unexpected = Ending.of(new IllegalStateException("boom"));
        assertEquals(ExitCodes.RUN_FAILURE, unexpected.exitCode());
        assertEquals("the run failed: java.lang.IllegalStateException: boom", unexpected.summary());
        assertTrue(unexpected.trace());
    }

    @Test
    @DisplayName("a driver refused by an authenticating cluster (Spark's SASL message, as a driver without the "
            + "secret got from deploy/loopback-cluster): exit 1 and how to give it the secret, no stack trace")
    void noSecret() {
        RuntimeException refused = new RuntimeException("Exception thrown in awaitResult: ",
                new RuntimeException("java.lang.IllegalStateException: Expected SaslMessage, received something else "
                        + "(maybe your client does not have SASL enabled?)"));
        Ending ending = Ending.of(refused);
        assertEquals(ExitCodes.RUN_FAILURE, ending.exitCode());
        assertTrue(ending.summary().contains(SparkSecret.ENVIRONMENT), ending.summary());
        assertFalse(ending.trace());
    }
}
