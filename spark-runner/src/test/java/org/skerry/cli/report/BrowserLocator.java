package org.skerry.cli.report;

import static org.junit.jupiter.api.Assertions.fail;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import java.io.File;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import java.util.Optional;

/**
 * Finds a Chromium-family browser for the browser tests: the executable named by
 * {@code SKERRY_TEST_BROWSER}, else the first of {@link #NAMES} on PATH. Without one the tests are
 * skipped, except under CI ({@code CI=true}), where a missing browser must not pass silently.
 */
final class BrowserLocator {

    static final List<String> NAMES = List.of("chromium", "chromium-browser", "google-chrome");

    static Optional<Path> find(Map<String, String> environment) {
        String named = environment.get("SKERRY_TEST_BROWSER");
        if (named != null && !named.isBlank()) {
            Path path = Path.of(named);
            return Files.isExecutable(path) ? Optional.of(path) : Optional.empty();
        }
        String searchPath = environment.getOrDefault("PATH", "");
        for (String name : NAMES) {
            for (String folder : searchPath.split(File.pathSeparator)) {
                if (folder.isEmpty()) {
                    continue;
                }
                Path candidate = Path.of(folder, name);
                if (Files.isRegularFile(candidate) && Files.isExecutable(candidate)) {
                    return Optional.of(candidate);
                }
            }
        }
        return Optional.empty();
    }

    /** The browser; fails under CI and skips elsewhere when there is none. */
    static Path require() {
        Map<String, String> environment = System.getenv();
        Optional<Path> browser = find(environment);
        if (browser.isEmpty()) {
            String looked = environment.get("SKERRY_TEST_BROWSER") != null
                    ? "SKERRY_TEST_BROWSER=" + environment.get("SKERRY_TEST_BROWSER") + " is not an executable file"
                    : "none of " + NAMES + " on PATH";
            String message = "no headless browser for the report page: " + looked + "; install Debian's chromium "
                    + "(apt-get install --no-install-recommends chromium, as .ci/run does) or set SKERRY_TEST_BROWSER "
                    + "to a Chromium executable";
            if ("true".equals(environment.get("CI"))) {
                fail(message);
            }
            assumeTrue(false, message + "; skipped outside CI");
        }
        return browser.get();
    }

    private BrowserLocator() {
    }
}
