package org.skerry.cli.progress;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.time.Clock;
import java.time.Instant;
import java.time.ZoneOffset;
import java.util.List;
import org.junit.jupiter.api.Test;

class BatchProgressTest {

    private static final Clock FIXED = Clock.fixed(Instant.parse("2026-12-02T06:00:00Z"), ZoneOffset.UTC);

    @Test
    void logLinesCountEveryState() {
        StringWriter text = new StringWriter();
        BatchProgress progress = new BatchProgress(new PrintWriter(text), false, 3, 2, FIXED);
        progress.started("a/x");
        progress.started("b/x");
        progress.finished("a/x", 65);
        progress.failed("b/x", "bad input: data.csv: line 4");
        progress.close();
        List<String> lines = text.toString().lines().toList();
        assertEquals(4, lines.size(), text.toString());
        assertEquals("2026-12-02T06:00:00Z analyses: 2 done, 1 running, 0 failed, 2 waiting  0:00:00  (started a/x)",
                lines.get(0));
        assertTrue(lines.get(2).contains("3 done, 1 running, 0 failed, 1 waiting") && lines.get(2).contains("in 0:01:05"),
                lines.get(2));
        assertTrue(lines.get(3).contains("3 done, 0 running, 1 failed, 1 waiting")
                && lines.get(3).endsWith("(failed b/x: bad input: data.csv: line 4)"), lines.get(3));
    }

    @Test
    void liveLineIsRewrittenAndFailuresStayVisible() {
        StringWriter text = new StringWriter();
        BatchProgress progress = new BatchProgress(new PrintWriter(text), true, 1, 0, FIXED);
        progress.started("a/x");
        progress.failed("a/x", "the run failed at iteration 3");
        progress.close();
        String out = text.toString();
        assertTrue(out.startsWith("\ranalyses: 0 done, 1 running, 0 failed, 0 waiting"), out);
        assertTrue(out.contains("failed a/x: the run failed at iteration 3\n"), out);
        assertTrue(out.endsWith("analyses: 0 done, 0 running, 1 failed, 0 waiting  0:00:00\n"), out);
    }
}
