package org.skerry.cli.report;

import java.awt.image.BufferedImage;
import java.net.URI;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Set;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/** Judges what the browser left: its log's resource loads and how much a screenshot shows. */
final class BrowserEvidence {

    /**
     * Chromium (156, Debian) logs at verbosity 1 each file: load it starts, but not a missing
     * file's failure; so a load fails here when the file it names is not a file.
     */
    private static final Pattern FILE_LOAD = Pattern.compile("FileURLLoader::Start: (file:\\S+)");

    /** What Chromium writes when a page's load fails or is refused, wherever it does log one. */
    private static final List<String> FAILURE_MARKERS =
            List.of("net::ERR_", "Failed to load", "Not allowed to load local resource");

    private BrowserEvidence() {
    }

    /** Every file: address the log says the browser started loading, in order. */
    static List<URI> fileLoads(String log) {
        List<URI> loads = new ArrayList<>();
        Matcher matcher = FILE_LOAD.matcher(log);
        while (matcher.find()) {
            loads.add(URI.create(matcher.group(1)));
        }
        return loads;
    }

    /**
     * Loads that failed: a file: load of something that is not a file, and any log line with a
     * failure marker that names {@code folder}'s address (the browser's own chatter names none).
     */
    static List<String> failedLoads(String log, Path folder) {
        List<String> failed = new ArrayList<>();
        for (URI load : fileLoads(log)) {
            if (!Files.isRegularFile(Path.of(load))) {
                failed.add("not a file: " + load);
            }
        }
        String address = folder.toAbsolutePath().toUri().toString();
        log.lines().filter(line -> line.contains(address))
                .filter(line -> FAILURE_MARKERS.stream().anyMatch(line::contains)).forEach(failed::add);
        return failed;
    }

    /** The share of pixels that are not (near) white. */
    static double inkShare(BufferedImage image) {
        long ink = 0;
        for (int y = 0; y < image.getHeight(); y++) {
            for (int x = 0; x < image.getWidth(); x++) {
                int rgb = image.getRGB(x, y);
                int darkest = Math.min((rgb >> 16) & 0xff, Math.min((rgb >> 8) & 0xff, rgb & 0xff));
                if (darkest < 240) {
                    ink++;
                }
            }
        }
        return (double) ink / ((long) image.getWidth() * image.getHeight());
    }

    /** How many distinct colours the image holds. */
    static int distinctColours(BufferedImage image) {
        Set<Integer> colours = new HashSet<>();
        for (int y = 0; y < image.getHeight(); y++) {
            for (int x = 0; x < image.getWidth(); x++) {
                colours.add(image.getRGB(x, y) & 0xffffff);
            }
        }
        return colours.size();
    }
}
