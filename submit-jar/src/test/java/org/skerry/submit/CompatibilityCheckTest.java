package org.skerry.submit;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.util.List;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/**
 * The start-up version check with injected version strings. What counts as compatible follows
 * Spark's versioning policy (https://spark.apache.org/versioning-policy.html: binary compatibility
 * is kept within a minor line, 4.2.x) and Scala's binary compatibility within 2.13.x
 * (https://docs.scala-lang.org/overviews/core/binary-compatibility-of-scala-releases.html).
 */
class CompatibilityCheckTest {

    private final CompatibilityCheck built = new CompatibilityCheck("4.2.0", "2.13", 17);

    @ParameterizedTest
    @CsvSource({"4.2.0, 2.13.18, 17", "4.2.1, 2.13.8, 21", "4.2.3-SNAPSHOT, 2.13.18, 25", "4.2.0, 2.13.18, 17.0.2"})
    @DisplayName("the same Spark minor line, Scala 2.13 and Java 17 or newer fit")
    void fits(String spark, String scala, String java) {
        assertEquals(List.of(), built.problems(spark, scala, java));
    }

    @ParameterizedTest
    @CsvSource({
        "4.1.1, 2.13.17, 17, Spark 4.1.1",
        "4.3.0, 2.13.18, 17, Spark 4.3.0",
        "3.5.1, 2.13.17, 17, Spark 3.5.1",
        "4.2.0, 2.12.18, 17, Scala 2.12.18",
        "4.2.0, 3.3.1, 17, Scala 3.3.1",
        "4.2.0, 2.13.18, 11, Java 11",
        "4.2.0, 2.13.18, 1.8, Java 1.8"})
    @DisplayName("another Spark minor line, another Scala or an older Java: one problem naming the version found")
    void misfits(String spark, String scala, String java, String named) {
        List<String> problems = built.problems(spark, scala, java);
        assertEquals(1, problems.size(), problems.toString());
        assertTrue(problems.get(0).contains(named), problems.get(0));
    }

    @Test
    @DisplayName("no Spark on the class path: says to use spark-submit")
    void noSpark() {
        List<String> problems = built.problems(null, "2.13.17", "17");
        assertEquals(1, problems.size());
        assertTrue(problems.get(0).startsWith("no Spark on the class path"), problems.get(0));
    }

    @Test
    @DisplayName("a misfit: exit 2 and a message that names what the jar needs and each problem, no stack trace")
    void message() {
        ByteArrayOutputStream bytes = new ByteArrayOutputStream();
        PrintStream err = new PrintStream(bytes, true, StandardCharsets.UTF_8);
        int code = SubmitMain.check(built, "3.5.1", "2.12.18", "17", err);
        String text = bytes.toString(StandardCharsets.UTF_8);
        assertEquals(2, code);
        assertTrue(text.startsWith("skerry: bad input: this skerry jar cannot run here; it needs "
                + "Spark 4.2.x, Scala 2.13, Java 17 or newer:"), text);
        assertTrue(text.contains("Spark 3.5.1") && text.contains("Scala 2.12.18"), text);
        assertTrue(!text.contains("\tat ") && !text.contains("Exception"), text);
    }

    @Test
    @DisplayName("the built-for versions come from the jar's properties (the pom's Spark), and the Spark and Scala "
            + "on this test's class path (Maven's spark-core) are read and fit")
    void runningVersionsFit() {
        CompatibilityCheck fromJar = SubmitMain.builtFor();
        String spark = SubmitMain.runningSpark();
        String scala = SubmitMain.runningScala();
        assertTrue(spark != null && spark.startsWith("4.2."), "Spark on the test class path: " + spark);
        assertTrue(scala != null && scala.startsWith("2.13."), "Scala on the test class path: " + scala);
        assertEquals(List.of(), fromJar.problems(spark, scala, System.getProperty("java.specification.version")));
        assertEquals("Spark 4.2.x, Scala 2.13, Java 17 or newer", fromJar.needs());
    }
}
