package org.skerry.cli.runfile;

import com.typesafe.config.Config;
import com.typesafe.config.ConfigException;
import com.typesafe.config.ConfigFactory;
import com.typesafe.config.ConfigIncludeContext;
import com.typesafe.config.ConfigIncluder;
import com.typesafe.config.ConfigIncluderFile;
import com.typesafe.config.ConfigObject;
import com.typesafe.config.ConfigParseOptions;
import com.typesafe.config.ConfigSyntax;
import java.io.File;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.regex.Pattern;

/**
 * Handles {@code include "name"} and {@code include file("name")} in the files a user writes:
 * HOCON silently ignores an include whose file is missing (unless written {@code required(…)}),
 * so a misspelt include would drop its settings without a word; here every included file must
 * exist. A relative name is read from the folder of the file that holds the include; a name
 * without a known extension is tried as {@code name.conf}, {@code name.json} and
 * {@code name.properties}, as HOCON does. URLs and class-path resources are left to the default
 * includer.
 */
final class RequiredIncluder implements ConfigIncluder, ConfigIncluderFile {

    private static final Pattern URL = Pattern.compile("^[A-Za-z][A-Za-z0-9+.-]*://.*");
    private static final List<String> EXTENSIONS = List.of(".conf", ".json", ".properties");

    private final Path file;
    private final ConfigIncluder fallback;

    /** @param file the file whose includes this handles (absolute) */
    private RequiredIncluder(Path file, ConfigIncluder fallback) {
        this.file = file;
        this.fallback = fallback;
    }

    /** Parse options for {@code file} (absolute) that refuse a missing include. */
    static ConfigParseOptions options(Path file, ConfigSyntax syntax) {
        return ConfigParseOptions.defaults().setSyntax(syntax).setAllowMissing(false)
                .setIncluder(new RequiredIncluder(file, null));
    }

    @Override
    public ConfigIncluder withFallback(ConfigIncluder fallback) {
        return new RequiredIncluder(file, fallback);
    }

    @Override
    public ConfigObject include(ConfigIncludeContext context, String name) {
        if (URL.matcher(name).matches() && fallback != null) {
            return fallback.include(context, name);
        }
        Path folder = file.getParent();
        Path named = folder == null ? Path.of(name) : folder.resolve(name);
        return read(named.normalize(), name);
    }

    @Override
    public ConfigObject includeFile(ConfigIncludeContext context, File name) {
        // file("…") is read as HOCON reads it: a relative name from the working folder.
        return read(name.toPath().toAbsolutePath().normalize(), name.toString());
    }

    private ConfigObject read(Path named, String name) {
        String lower = named.getFileName() == null ? "" : named.getFileName().toString().toLowerCase(Locale.ROOT);
        List<Path> candidates = new ArrayList<>();
        if (EXTENSIONS.stream().anyMatch(lower::endsWith) || Files.isRegularFile(named)) {
            candidates.add(named);
        } else {
            for (String extension : EXTENSIONS) {
                Path withExtension = named.resolveSibling(named.getFileName() + extension);
                if (Files.isRegularFile(withExtension)) {
                    candidates.add(withExtension);
                }
            }
        }
        if (candidates.isEmpty() || !Files.isRegularFile(candidates.get(0))) {
            String problem = Files.isDirectory(named) ? "it is a folder" : "no such file";
            throw new RunFileException(location(name) + ": include \"" + name + "\": " + problem + " " + named
                    + (candidates.isEmpty() && !EXTENSIONS.stream().anyMatch(lower::endsWith)
                            ? " (nor with .conf, .json or .properties)" : ""));
        }
        Config merged = ConfigFactory.empty();
        for (Path candidate : candidates) {
            String candidateName = candidate.getFileName().toString().toLowerCase(Locale.ROOT);
            ConfigSyntax syntax = candidateName.endsWith(".json") ? ConfigSyntax.JSON
                    : candidateName.endsWith(".properties") ? ConfigSyntax.PROPERTIES : ConfigSyntax.CONF;
            if (!Files.isReadable(candidate)) {
                throw new RunFileException(location(name) + ": include \"" + name + "\": cannot read " + candidate
                        + ": permission denied");
            }
            try {
                merged = merged.withFallback(ConfigFactory.parseFile(candidate.toFile(), options(candidate, syntax)));
            } catch (ConfigException e) {
                throw new RunFileException(RunFile.located(e), e);
            }
        }
        return merged.root();
    }

    /** "run.conf: line 7", the line of this file that includes {@code name}, or the file alone. */
    private String location(String name) {
        try {
            List<String> lines = Files.readAllLines(file);
            for (int i = 0; i < lines.size(); i++) {
                String line = lines.get(i);
                if (line.contains("include") && line.contains("\"" + name + "\"")) {
                    return RunFile.shorten(file) + ": line " + (i + 1);
                }
            }
        } catch (IOException e) {
            // the file was just parsed; if it cannot be read again, name it without a line
        }
        return RunFile.shorten(file).toString();
    }
}
