package org.skerry.engine.process;

import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;

/**
 * The environment a user's program gets: a few basics taken from this JVM's own environment
 * (where programs are found, the home folder, the language and time zone), then what the run file
 * adds, and {@code TMPDIR} pointing into the program's own scratch folder. Nothing else of the
 * JVM's environment is passed on, so credentials or settings that happen to be set where skerry
 * runs do not leak into a program, and a run behaves the same wherever it is started.
 */
public final class ChildEnvironment {

    /** The variables passed on from this JVM's environment when set. */
    public static final List<String> BASICS = List.of("PATH", "HOME", "USER", "LOGNAME", "LANG", "LC_ALL",
            "LC_CTYPE", "LC_NUMERIC", "TZ", "SYSTEMROOT");

    private ChildEnvironment() {
    }

    /** The basics, then {@code added} (which wins), then {@code TMPDIR=scratch} unless added sets it. */
    public static Map<String, String> of(Map<String, String> added, Path scratch) {
        Map<String, String> environment = new TreeMap<>();
        Map<String, String> own = System.getenv();
        for (String name : BASICS) {
            String value = own.get(name);
            if (value != null) {
                environment.put(name, value);
            }
        }
        environment.putAll(added);
        if (scratch != null) {
            environment.putIfAbsent("TMPDIR", scratch.toString());
        }
        return environment;
    }
}
