package org.skerry.submit;

import java.io.IOException;
import java.io.InputStream;
import java.io.PrintStream;
import java.io.PrintWriter;
import java.util.List;
import java.util.Properties;
import org.skerry.cli.SkerryCommand;

/**
 * The main class of the spark-submit jar: checks that the cluster's Spark, Scala and Java fit the
 * jar (exit 2 with what is wrong when they do not, before Spark fails somewhere deep with a
 * missing method), then runs the skerry command with the given arguments.
 */
public final class SubmitMain {

    /** Exit code of a version mismatch: bad input, as for every other set-up error of the command. */
    static final int INCOMPATIBLE = 2;

    private SubmitMain() {
    }

    public static void main(String[] args) {
        int code = check(builtFor(), runningSpark(), runningScala(), System.getProperty("java.specification.version"),
                System.err);
        if (code != 0) {
            System.exit(code);
        }
        int exit = SkerryCommand.execute(args, new PrintWriter(System.out, true), new PrintWriter(System.err, true));
        // Return normally on success: under YARN in cluster mode the application master reports a
        // driver that calls System.exit, even with 0, as FAILED ("Shutdown hook called before final
        // status was reported"). A failure still exits with its code, which YARN reports.
        if (exit != 0) {
            System.exit(exit);
        }
    }

    /** Prints what is wrong to {@code err} and returns the exit code (0 when the versions fit). */
    static int check(CompatibilityCheck built, String spark, String scala, String java, PrintStream err) {
        List<String> problems = built.problems(spark, scala, java);
        if (problems.isEmpty()) {
            return 0;
        }
        err.println("skerry: bad input: this skerry jar cannot run here; it needs " + built.needs() + ":");
        for (String problem : problems) {
            err.println("skerry:   " + problem);
        }
        err.println("skerry: submit it to a cluster with a matching Spark distribution, or rebuild skerry against "
                + "the cluster's Spark (the spark.version property in pom.xml)");
        err.flush();
        return INCOMPATIBLE;
    }

    /** What this jar was built against, from the properties file Maven filled in. */
    static CompatibilityCheck builtFor() {
        Properties built = new Properties();
        try (InputStream in = SubmitMain.class.getResourceAsStream("/skerry-submit.properties")) {
            if (in == null) {
                throw new IllegalStateException("skerry-submit.properties is missing from the jar");
            }
            built.load(in);
        } catch (IOException e) {
            throw new IllegalStateException("cannot read skerry-submit.properties from the jar", e);
        }
        return new CompatibilityCheck(built.getProperty("spark.version"), built.getProperty("scala.binary"),
                Integer.parseInt(built.getProperty("java.release").strip()));
    }

    /** The running Spark's version, or null without Spark; read reflectively so a missing Spark is a message. */
    static String runningSpark() {
        try {
            Class<?> sparkPackage = Class.forName("org.apache.spark.package$");
            Object module = sparkPackage.getField("MODULE$").get(null);
            return (String) sparkPackage.getMethod("SPARK_VERSION").invoke(module);
        } catch (ReflectiveOperationException | LinkageError e) {
            return null;
        }
    }

    /** The running Scala library's version, or null without one. */
    static String runningScala() {
        try {
            return (String) Class.forName("scala.util.Properties").getMethod("versionNumberString").invoke(null);
        } catch (ReflectiveOperationException | LinkageError e) {
            return null;
        }
    }
}
