package org.skerry.cli.runfile;

import com.typesafe.config.Config;
import com.typesafe.config.ConfigException;
import com.typesafe.config.ConfigFactory;
import com.typesafe.config.ConfigParseOptions;
import java.nio.file.Path;
import java.util.List;

/**
 * How run, batch and study files are read, written once: parse the user's HOCON file (every
 * include must exist, {@link RequiredIncluder}), lay the caller's layers on top, refuse keys the
 * defaults do not know (outside the file kind's free-form sections, with the closest known key
 * suggested), then resolve over the defaults from the class path. Every problem is a
 * {@link RunFileException} naming the file and line.
 *
 * @param what        the kind of file, as messages name it ("run file", "batch file")
 * @param defaults    the class-path resource holding the defaults and so the known keys
 * @param freeForm    sections whose keys are the user's own
 * @param unknownHint added to the message about an unknown key (may be empty)
 */
public record SettingsFile(String what, String defaults, List<String> freeForm, String unknownHint) {

    public SettingsFile {
        freeForm = List.copyOf(freeForm);
    }

    /** Reads {@code path}, checks its keys and resolves it over the defaults. */
    public Config load(Path path) {
        return load(path, ConfigFactory.empty());
    }

    /**
     * As {@link #load(Path)}, with {@code layers} laid over the file (their keys are checked too,
     * and their origins appear in the errors they cause).
     */
    public Config load(Path path, Config layers) {
        return resolve(layers.withFallback(RunFile.parse(path, what)));
    }

    /** Checks the keys of a parsed file with its layers and resolves it over the defaults. */
    Config resolve(Config user) {
        Config reference = ConfigFactory.parseResources(SettingsFile.class.getClassLoader(), defaults,
                ConfigParseOptions.defaults().setAllowMissing(false));
        RunFile.checkKnownKeys(user, reference, freeForm, unknownHint);
        try {
            return user.withFallback(reference).resolve();
        } catch (ConfigException e) {
            throw new RunFileException(RunFile.located(e), e);
        }
    }
}
