package org.skerry.cli;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Map;
import org.skerry.cli.runfile.RunFileException;

/**
 * The shared secret of a cluster that authenticates (Spark's {@code spark.authenticate}), read
 * from the file named by {@link #ENVIRONMENT} rather than given on a command line, where every
 * user of the machine could read it in the process list, or in a run file, which the run folder
 * keeps. Spark itself takes a secret file only on Kubernetes, hence this.
 */
final class SparkSecret {

    /** The environment variable naming the file that holds the secret (deploy/loopback-cluster writes DIR/secret). */
    static final String ENVIRONMENT = "SKERRY_SPARK_SECRET_FILE";

    private SparkSecret() {
    }

    /**
     * The variable through which a standalone worker hands the secret to the processes it starts
     * (Spark's SecurityManager.ENV_AUTH_SECRET): a driver in cluster mode finds it there, while
     * Spark removes the secret from that driver's command line and its settings.
     */
    static final String WORKER_ENVIRONMENT = "_SPARK_AUTH_SECRET";

    /**
     * Adds authentication with the secret to {@code settings} when {@code environment} names a
     * secret file, or, for a driver a standalone worker started, when the worker handed it the
     * secret but not the setting Spark's driver insists on ({@code authenticate}: whether Spark's
     * settings already ask for authentication; kept for the message of a future check).
     */
    static void addTo(Map<String, String> settings, Map<String, String> environment, boolean authenticate,
            boolean hasSecret) {
        String name = environment.get(ENVIRONMENT);
        if (name == null || name.isBlank()) {
            String handed = environment.get(WORKER_ENVIRONMENT);
            if (!hasSecret && handed != null && !handed.isEmpty()) {
                settings.put("spark.authenticate", "true");
                settings.put("spark.authenticate.secret", handed);
            }
            return;
        }
        Path file = Path.of(name);
        String secret;
        try {
            secret = Files.readString(file, StandardCharsets.UTF_8).strip();
        } catch (IOException e) {
            throw new RunFileException("cannot read the Spark secret file " + file + " named by " + ENVIRONMENT + ": "
                    + e.getMessage(), e);
        }
        if (secret.isEmpty() || secret.lines().count() != 1) {
            throw new RunFileException("the Spark secret file " + file + " named by " + ENVIRONMENT
                    + " must hold the secret on one line; it holds " + secret.lines().count() + " lines");
        }
        settings.put("spark.authenticate", "true");
        settings.put("spark.authenticate.secret", secret);
    }
}
