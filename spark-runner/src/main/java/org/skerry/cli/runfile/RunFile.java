package org.skerry.cli.runfile;

import com.typesafe.config.Config;
import com.typesafe.config.ConfigException;
import com.typesafe.config.ConfigFactory;
import com.typesafe.config.ConfigObject;
import com.typesafe.config.ConfigOrigin;
import com.typesafe.config.ConfigParseOptions;
import com.typesafe.config.ConfigRenderOptions;
import com.typesafe.config.ConfigSyntax;
import com.typesafe.config.ConfigValue;
import com.typesafe.config.ConfigValueType;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.TreeSet;
import org.skerry.engine.settings.Origins;

/**
 * A run file read with Typesafe Config: the user's HOCON file, then {@code --set key=value}
 * overrides on top, then the defaults of the jar's {@code reference.conf} underneath. Every key
 * the user writes must be a known one (outside the free-form model settings, data bindings and
 * inline data); an unknown key is refused with the closest known key suggested.
 */
public final class RunFile {

    /** Run files: defaults in reference.conf; the user's own keys in model settings, role bindings, inline data. */
    static final SettingsFile KIND = new SettingsFile("run file", "reference.conf",
            List.of("model.settings", "model.program", "data.columns", "data.inline", "backend.spark",
                    "sampler.abc.distance-weights", "sampler.abc.observed"), "");

    private final Path path;
    private final Config config;

    private RunFile(Path path, Config config) {
        this.path = path;
        this.config = config;
    }

    /**
     * Reads, overrides, checks and resolves a run file.
     *
     * @param overrides {@code key=value} strings; the value is HOCON (a number, a quoted or bare
     *     string, a list …)
     * @throws RunFileException naming the file, line and key of the first problem found
     */
    public static RunFile load(Path path, List<String> overrides) {
        return load(path, ConfigFactory.empty(), overrides);
    }

    /**
     * As {@link #load(Path, List)}, with {@code settings} laid over the file beneath the
     * overrides: a batch's per-dataset and per-variant settings, whose origins (file and line)
     * then appear in any error they cause.
     */
    public static RunFile load(Path path, Config settings, List<String> overrides) {
        Config layers = settings;
        for (int i = overrides.size() - 1; i >= 0; i--) {
            layers = parseOverride(overrides.get(i)).withFallback(layers);
        }
        return new RunFile(path, KIND.load(path, layers));
    }

    /**
     * Parses a HOCON file the user wrote ({@code what}: "run file", "batch file"), errors located.
     * Every file it includes must exist ({@link RequiredIncluder}), read from the including
     * file's folder.
     */
    public static Config parse(Path path, String what) {
        if (Files.isDirectory(path)) {
            throw new RunFileException("cannot read " + what + " " + path + ": it is a folder, not a file");
        }
        if (!Files.isRegularFile(path)) {
            throw new RunFileException("cannot read " + what + " " + path + ": no such file");
        }
        if (!Files.isReadable(path)) {
            throw new RunFileException("cannot read " + what + " " + path + ": permission denied");
        }
        Path absolute = path.toAbsolutePath().normalize();
        try {
            return ConfigFactory.parseFile(absolute.toFile(), RequiredIncluder.options(absolute, ConfigSyntax.CONF));
        } catch (ConfigException e) {
            throw new RunFileException(syntaxError(e), e);
        }
    }

    private static final String CLOSE_PARENTHESIS = "expecting a close parentheses ')' here, not: ";

    /**
     * A parse error, located. Typesafe Config reports a missing '}' as "expecting a close
     * parentheses ')'" (the text of its include parser, reused where a key is expected): say
     * what is really missing, and which '{' is still open at the end of the file.
     */
    private static String syntaxError(ConfigException e) {
        String message = located(e);
        int at = message.indexOf(CLOSE_PARENTHESIS);
        if (at < 0 || e.origin() == null || e.origin().filename() == null) {
            return message;
        }
        Path file = Path.of(e.origin().filename());
        List<String> lines;
        try {
            lines = Files.readAllLines(file);
        } catch (java.io.IOException | RuntimeException unreadable) {
            return message;
        }
        int line = e.origin().lineNumber();
        if (line >= 1 && line <= lines.size() && lines.get(line - 1).contains("include")) {
            return message; // a real include(…) missing its ')'
        }
        String found = message.substring(at + CLOSE_PARENTHESIS.length());
        String prefix = message.substring(0, at);
        if (found.startsWith("end of file")) {
            int open = unclosedBrace(String.join("\n", lines));
            if (open > 0) {
                return shorten(file) + ": line " + open + ": this '{' is never closed: the file ends (line " + line
                        + ") before its '}'";
            }
            return prefix + "a '{' is not closed: expecting '}' before the end of the file";
        }
        return prefix + "expecting a key or a closing brace '}' here, not: " + found;
    }

    /**
     * The line of the innermost '{' still open at the end of {@code text}, skipping strings and
     * comments, or -1 when every brace is closed.
     */
    static int unclosedBrace(String text) {
        java.util.ArrayDeque<Integer> open = new java.util.ArrayDeque<>();
        int line = 1;
        int i = 0;
        while (i < text.length()) {
            char c = text.charAt(i);
            if (c == '\n') {
                line++;
                i++;
            } else if (text.startsWith("\"\"\"", i)) {
                int end = text.indexOf("\"\"\"", i + 3);
                end = end < 0 ? text.length() : end + 3;
                line += count(text, i, end);
                i = end;
            } else if (c == '"') {
                int j = i + 1;
                while (j < text.length() && text.charAt(j) != '"' && text.charAt(j) != '\n') {
                    j += text.charAt(j) == '\\' ? 2 : 1;
                }
                i = Math.min(j + 1, text.length());
                if (j < text.length() && text.charAt(j) == '\n') {
                    i = j;
                }
            } else if (c == '#' || text.startsWith("//", i)) {
                int end = text.indexOf('\n', i);
                i = end < 0 ? text.length() : end;
            } else {
                if (c == '{') {
                    open.push(line);
                } else if (c == '}' && !open.isEmpty()) {
                    open.pop();
                }
                i++;
            }
        }
        return open.isEmpty() ? -1 : open.peek();
    }

    private static int count(String text, int from, int to) {
        int n = 0;
        for (int i = from; i < to; i++) {
            n += text.charAt(i) == '\n' ? 1 : 0;
        }
        return n;
    }

    private static Config parseOverride(String override) {
        int equals = override.indexOf('=');
        if (equals <= 0) {
            throw new RunFileException("--set " + override + ": expected key=value");
        }
        String key = override.substring(0, equals).trim();
        String value = override.substring(equals + 1).trim();
        try {
            return ConfigFactory.parseString(key + " = " + (value.isEmpty() ? "\"\"" : value),
                    ConfigParseOptions.defaults().setOriginDescription("--set " + override));
        } catch (ConfigException e) {
            try {
                // A bare value HOCON cannot parse (a path with a colon, say) is taken as a string.
                return ConfigFactory.parseString(key + " = " + quote(value),
                        ConfigParseOptions.defaults().setOriginDescription("--set " + override));
            } catch (ConfigException again) {
                throw new RunFileException("--set " + override + ": " + again.getMessage(), again);
            }
        }
    }

    private static String quote(String value) {
        return '"' + value.replace("\\", "\\\\").replace("\"", "\\\"") + '"';
    }

    /** "run.conf: line 7: what is wrong", from an exception that knows its origin. */
    public static String located(ConfigException e) {
        String message = e.getMessage();
        if (e.origin() == null) {
            return message;
        }
        String prefix = e.origin().description() + ": ";
        String rest = message.startsWith(prefix) ? message.substring(prefix.length()) : message;
        return describe(e.origin()) + ": " + rest;
    }

    /** Refuses the first key of {@code user} that {@code reference} lacks, outside the free-form sections. */
    static void checkKnownKeys(Config user, Config reference, List<String> freeForm, String unknownHint) {
        TreeSet<String> known = new TreeSet<>();
        collectPaths(reference.root(), "", known);
        List<String> unknown = new ArrayList<>();
        collectLeaves(user.root(), "", unknown, freeForm);
        for (String key : unknown) {
            if (isFreeForm(key, freeForm)) {
                continue;
            }
            if (known.contains(key)) {
                ConfigValue group = valueAt(reference.root(), key);
                ConfigValue given = valueAt(user.root(), key);
                if (group instanceof ConfigObject && !((ConfigObject) group).isEmpty()
                        && given != null && !(given instanceof ConfigObject)) {
                    String example = example(key, (ConfigObject) group);
                    throw new RunFileException(describe(given.origin()) + ": " + key + " = "
                            + given.render(ConfigRenderOptions.concise()) + ": " + key + " is a group of settings, "
                            + "not a value; set its keys instead, e.g. " + example + " = …");
                }
                continue;
            }
            // A user object where reference has a leaf, or the reverse, is a type error found later.
            boolean prefixOfKnown = known.stream().anyMatch(k -> k.startsWith(key + "."));
            boolean underKnownLeaf = known.stream().anyMatch(k -> key.startsWith(k + ".") && !reference.getIsNull(k)
                    && reference.getValue(k).valueType() != ConfigValueType.OBJECT);
            if (prefixOfKnown || underKnownLeaf) {
                continue;
            }
            String suggestion = KeySuggestion.closest(key, known);
            throw new RunFileException(where(user, key) + ": unknown setting '" + key + "'"
                    + (suggestion == null ? "" : "; did you mean '" + suggestion + "'?") + unknownHint);
        }
    }

    /** A setting inside group {@code key}, to show: its shortest leaf key (alphabetical among equals). */
    private static String example(String key, ConfigObject group) {
        List<String> leaves = new ArrayList<>();
        collectLeaves(group, key + ".", leaves, List.of());
        leaves.sort(java.util.Comparator.comparingInt(String::length).thenComparing(java.util.Comparator.naturalOrder()));
        return leaves.isEmpty() ? key + ".…" : leaves.get(0);
    }

    /** The value at a dotted key (segments quoted as {@link #quoteKey} writes them), or null. */
    private static ConfigValue valueAt(ConfigObject root, String key) {
        ConfigValue value = root;
        for (String segment : com.typesafe.config.ConfigUtil.splitPath(key)) {
            if (!(value instanceof ConfigObject)) {
                return null;
            }
            value = ((ConfigObject) value).get(segment);
        }
        return value;
    }

    private static boolean isFreeForm(String key, List<String> freeForm) {
        for (String section : freeForm) {
            if (key.equals(section) || key.startsWith(section + ".")) {
                return true;
            }
        }
        return false;
    }

    private static void collectPaths(ConfigObject object, String prefix, TreeSet<String> out) {
        for (Map.Entry<String, ConfigValue> entry : object.entrySet()) {
            String key = prefix + quoteKey(entry.getKey());
            out.add(key);
            if (entry.getValue() instanceof ConfigObject) {
                collectPaths((ConfigObject) entry.getValue(), key + ".", out);
            }
        }
    }

    private static void collectLeaves(ConfigObject object, String prefix, List<String> out, List<String> freeForm) {
        for (Map.Entry<String, ConfigValue> entry : object.entrySet()) {
            String key = prefix + quoteKey(entry.getKey());
            if (entry.getValue() instanceof ConfigObject && !isFreeForm(key, freeForm)) {
                ConfigObject child = (ConfigObject) entry.getValue();
                if (child.isEmpty()) {
                    out.add(key);
                }
                collectLeaves(child, key + ".", out, freeForm);
            } else {
                out.add(key);
            }
        }
    }

    private static String quoteKey(String segment) {
        return segment.matches("[A-Za-z0-9_-]+") ? segment : '"' + segment + '"';
    }

    /** "file:line" of a key's value, or the origin's description. */
    public static String where(Config config, String key) {
        try {
            return describe(config.getValue(key).origin());
        } catch (ConfigException e) {
            return describe(config.origin());
        }
    }

    /** As {@link Origins#describe}. */
    public static String describe(ConfigOrigin origin) {
        return Origins.describe(origin);
    }

    /** As {@link Origins#shorten}. */
    public static Path shorten(Path file) {
        return Origins.shorten(file);
    }

    /** The run file as read. */
    public Path path() {
        return path;
    }

    /** The resolved settings: overrides, then the file, then the defaults. */
    public Config config() {
        return config;
    }

    /** The same run file with one resolved setting replaced (e.g. a path made absolute for run.conf). */
    public RunFile withValue(String key, Object value) {
        return new RunFile(path, config.withValue(key, com.typesafe.config.ConfigValueFactory.fromAnyRef(value)));
    }

    /** The resolved settings as HOCON text, for the run folder's {@code run.conf}. */
    public String render() {
        return config.root().render(ConfigRenderOptions.defaults().setOriginComments(false).setComments(false)
                .setJson(false).setFormatted(true));
    }
}
