package org.skerry.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;

/** Runs the skerry command in this JVM and captures what it prints (public: the command's sub-packages test through it). */
public final class CommandRunner {

    public record Result(int exitCode, String out, String err) {
    }

    public static Result run(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int code = SkerryCommand.execute(args, new PrintWriter(out, true), new PrintWriter(err, true));
        return new Result(code, out.toString(), err.toString());
    }

    /** Asserts that {@code result} is bad input: exit code 2 and one message holding every fragment. */
    public static void assertBadInput(Result result, String... fragments) {
        assertEquals(ExitCodes.BAD_INPUT, result.exitCode(), result.err());
        String message = result.err().trim();
        assertTrue(message.startsWith("skerry: bad input:"), message);
        assertEquals(1, message.lines().count(), "one message: " + message);
        for (String fragment : fragments) {
            assertTrue(message.contains(fragment), "'" + fragment + "' in: " + message);
        }
    }

    private CommandRunner() {
    }
}
