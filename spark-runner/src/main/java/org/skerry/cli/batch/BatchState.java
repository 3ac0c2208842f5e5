package org.skerry.cli.batch;

import com.typesafe.config.Config;
import com.typesafe.config.ConfigFactory;
import com.typesafe.config.ConfigParseOptions;
import com.typesafe.config.ConfigRenderOptions;
import com.typesafe.config.ConfigSyntax;
import com.typesafe.config.ConfigUtil;
import com.typesafe.config.ConfigValue;
import com.typesafe.config.ConfigValueFactory;
import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.DigestInputStream;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.HexFormat;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.TreeMap;
import org.skerry.cli.Version;
import org.skerry.cli.output.AtomicFile;
import org.skerry.cli.runfile.BatchSpec;

/**
 * The batch folder's {@code batch.conf}: the resolved batch settings and the SHA-256 of every
 * dataset file, written when a batch starts (or resumes), so that a later run of the batch on the
 * same folder can tell whether anything that alters answers has changed since.
 */
final class BatchState {

    /** The file's name in the batch folder. */
    static final String FILE_NAME = "batch.conf";

    private final Config settings;
    private final Map<String, String> dataHashes;

    private BatchState(Config settings, Map<String, String> dataHashes) {
        this.settings = settings;
        this.dataHashes = dataHashes;
    }

    /** The state of {@code spec} now: its settings and the current content hashes of its data files. */
    static BatchState of(BatchSpec spec) {
        Map<String, String> hashes = new LinkedHashMap<>();
        for (BatchSpec.Dataset dataset : spec.datasets()) {
            hashes.put(dataset.name(), sha256(dataset.file()));
        }
        return new BatchState(spec.config(), hashes);
    }

    static BatchState read(Path file) throws IOException {
        Config saved;
        try {
            saved = ConfigFactory.parseFile(file.toFile(), ConfigParseOptions.defaults().setSyntax(ConfigSyntax.CONF)
                    .setAllowMissing(false));
        } catch (com.typesafe.config.ConfigException e) {
            throw new IOException(file + ": " + e.getMessage(), e);
        }
        Map<String, String> hashes = new LinkedHashMap<>();
        if (saved.hasPath("data-sha256")) {
            saved.getObject("data-sha256").forEach((name, value) -> hashes.put(name, String.valueOf(value.unwrapped())));
        }
        Config settings = saved.hasPath("settings") ? saved.getConfig("settings") : ConfigFactory.empty();
        return new BatchState(settings, hashes);
    }

    void write(Path file) throws IOException {
        Config data = ConfigFactory.empty();
        for (Map.Entry<String, String> e : dataHashes.entrySet()) {
            data = data.withValue(ConfigUtil.joinPath("data-sha256", e.getKey()), ConfigValueFactory.fromAnyRef(e.getValue()));
        }
        Config all = data.withValue("settings", settings.root());
        String text = "# resolved batch settings and data-file hashes, written by skerry "
                + Version.text().replaceAll("\\s+", " ").strip() + "\n"
                + "# a later `skerry batch` on this folder compares them before resuming\n"
                + all.root().render(ConfigRenderOptions.defaults().setOriginComments(false).setComments(false)
                        .setJson(false).setFormatted(true));
        AtomicFile.writeString(file, text.endsWith("\n") ? text : text + "\n");
    }

    /** The resolved batch settings. */
    Config settings() {
        return settings;
    }

    /** The SHA-256 of a dataset's file (hex), or null when the dataset is not recorded. */
    String dataHash(String dataset) {
        return dataHashes.get(dataset);
    }

    /** Leaf keys of {@code config} with their values in concise HOCON, in key order. */
    static Map<String, String> flatten(Config config) {
        Map<String, String> out = new TreeMap<>();
        for (Map.Entry<String, ConfigValue> e : config.entrySet()) {
            out.put(e.getKey(), e.getValue().render(ConfigRenderOptions.concise()));
        }
        return out;
    }

    static String sha256(Path file) {
        try (InputStream in = new DigestInputStream(Files.newInputStream(file), MessageDigest.getInstance("SHA-256"))) {
            DigestInputStream digest = (DigestInputStream) in;
            in.transferTo(java.io.OutputStream.nullOutputStream());
            return HexFormat.of().formatHex(digest.getMessageDigest().digest());
        } catch (IOException e) {
            return "unreadable";
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("every Java platform has SHA-256", e);
        }
    }
}
