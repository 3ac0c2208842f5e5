package org.skerry.submit;

import java.util.ArrayList;
import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * Whether the Spark, Scala and Java a cluster runs can run this jar: Spark of the same major and
 * minor release it was built against (Spark keeps binary compatibility within a minor line, not
 * across), the same Scala binary version (2.13), and a Java at least as new as the one it was
 * compiled for. Versions come in as strings so that a test can inject any.
 */
public final class CompatibilityCheck {

    private static final Pattern LEADING_NUMBERS = Pattern.compile("^(\\d+)(?:\\.(\\d+))?");

    private final String builtSpark;
    private final String builtScalaBinary;
    private final int builtJava;

    /**
     * @param builtSpark       the Spark version the jar was built against, e.g. "4.2.0"
     * @param builtScalaBinary its Scala binary version, e.g. "2.13"
     * @param builtJava        the Java release it was compiled for, e.g. 17
     */
    public CompatibilityCheck(String builtSpark, String builtScalaBinary, int builtJava) {
        this.builtSpark = builtSpark;
        this.builtScalaBinary = builtScalaBinary;
        this.builtJava = builtJava;
    }

    /** The line a user reads for what the jar needs, e.g. "Spark 4.2.x, Scala 2.13, Java 17 or newer". */
    public String needs() {
        return "Spark " + majorMinor(builtSpark) + ".x, Scala " + builtScalaBinary + ", Java " + builtJava + " or newer";
    }

    /**
     * What is wrong with the versions found, one line each; empty when they fit.
     *
     * @param spark the running Spark's version, or null when no Spark is on the class path
     * @param scala the running Scala library's version, e.g. "2.13.18", or null when absent
     * @param java  the running Java's version ({@code java.specification.version}), e.g. "17"
     */
    public List<String> problems(String spark, String scala, String java) {
        List<String> problems = new ArrayList<>();
        if (spark == null) {
            problems.add("no Spark on the class path: start this jar with spark-submit (or use bin/skerry, which brings its own Spark)");
        } else if (!majorMinor(builtSpark).equals(majorMinor(spark))) {
            problems.add("the cluster runs Spark " + spark + ", this jar was built for Spark " + majorMinor(builtSpark)
                    + ".x (built against " + builtSpark + ")");
        }
        if (scala == null) {
            problems.add("no Scala library on the class path");
        } else if (!majorMinor(builtScalaBinary).equals(majorMinor(scala))) {
            problems.add("the cluster's Spark runs on Scala " + scala + ", this jar needs Scala " + builtScalaBinary
                    + " (the _" + builtScalaBinary + " Spark build)");
        }
        Integer feature = leadingNumber(java);
        if (feature == null || feature < builtJava) {
            problems.add("the driver runs Java " + java + ", this jar needs Java " + builtJava + " or newer");
        }
        return problems;
    }

    /** "4.2" of "4.2.0" (or of "4.2.0-SNAPSHOT"); the whole text when it does not start with numbers. */
    static String majorMinor(String version) {
        Matcher m = LEADING_NUMBERS.matcher(version.strip());
        if (!m.find()) {
            return version.strip();
        }
        return m.group(2) == null ? m.group(1) : m.group(1) + "." + m.group(2);
    }

    /** 17 of "17", of "17.0.2", of "1.8" → 1 (old Java reports "1.8"; 1 is below any release we need). */
    private static Integer leadingNumber(String version) {
        if (version == null) {
            return null;
        }
        Matcher m = LEADING_NUMBERS.matcher(version.strip());
        return m.find() ? Integer.valueOf(m.group(1)) : null;
    }
}
