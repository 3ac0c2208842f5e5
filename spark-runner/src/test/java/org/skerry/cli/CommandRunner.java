package org.skerry.cli;

import java.io.PrintWriter;
import java.io.StringWriter;

/** Runs the skerry command in this JVM and captures what it prints. */
final class CommandRunner {

    record Result(int exitCode, String out, String err) {
    }

    static Result run(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int code = SkerryCommand.execute(args, new PrintWriter(out, true), new PrintWriter(err, true));
        return new Result(code, out.toString(), err.toString());
    }

    private CommandRunner() {
    }
}
