package org.skerry.clustertests;

import static org.junit.jupiter.api.Assertions.fail;

import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.skerry.engine.Slow;

/**
 * The YARN path, run only with {@code -Pyarn} (the pom leaves this class out otherwise), and not
 * built yet: it needs Spark's YARN support for the Spark skerry is built against,
 * {@code org.apache.spark:spark-yarn_2.13:4.1.1}, which the Maven repository reachable from our
 * machines does not have (3 Dec 2026: only 4.0.1 and 4.2.0, which fail against Spark 4.1.1 with
 * NoSuchMethodError). With the profile, Maven fails first, naming the missing artifact. Once it
 * is there, this test is to start Hadoop's mini YARN cluster (hadoop-minicluster, in its own JVM:
 * its Jersey 1 / javax web stack clashes with Spark 4's Jakarta one), submit the application jar
 * in client mode and compare the answer's bytes with local mode.
 */
@Slow
class YarnRunTest {

    @Test
    @DisplayName("Spark's YARN support is on the class path (the first thing a YARN run needs)")
    void yarnSupportPresent() {
        try {
            Class.forName("org.apache.spark.deploy.yarn.Client");
        } catch (ClassNotFoundException e) {
            fail("no Spark YARN support (org.apache.spark:spark-yarn_2.13) on the class path; run with -Pyarn");
        }
        fail("spark-yarn is present: write the mini-YARN run this class describes");
    }
}
