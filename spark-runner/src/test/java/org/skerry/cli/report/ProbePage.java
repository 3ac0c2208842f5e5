package org.skerry.cli.report;

import java.io.IOException;
import java.net.URI;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import org.apache.commons.text.StringEscapeUtils;
import org.jsoup.Jsoup;
import org.jsoup.nodes.Element;

/**
 * A test-owned page that shows a page under test, unchanged, in a frame and, once everything has
 * loaded, writes what the browser made of it into its own DOM, which {@code --dump-dom} then
 * prints: the title, and for each image whether loading finished and its decoded size. A missing
 * or undecodable image finishes with a natural width of 0, so this tells loaded from failed, which
 * the browser's log does not (Chromium logs a missing file: image only as a load it started).
 */
final class ProbePage {

    /** One image as the browser holds it; {@code inFigure} marks the page's first figure's image. */
    record Image(String src, boolean inFigure, boolean complete, int naturalWidth, int naturalHeight) {
    }

    /** What the probe saw; {@code error} is non-empty when it could not look into the frame. */
    record Seen(String title, List<Image> images, String error) {
    }

    private static final String SCRIPT = """
            window.addEventListener('load', function () {
              var out = [];
              try {
                var doc = document.getElementById('page').contentDocument;
                out.push(['title', doc.title].join('\\t'));
                var first = doc.querySelector('figure img');
                Array.prototype.forEach.call(doc.images, function (img) {
                  out.push(['img', img.getAttribute('src'), img === first, img.complete, img.naturalWidth,
                      img.naturalHeight].join('\\t'));
                });
              } catch (e) {
                out.push(['error', String(e)].join('\\t'));
              }
              document.getElementById('probe').textContent = out.join('\\n');
            });
            """;

    private ProbePage() {
    }

    /** Writes the probe for {@code page} to {@code file} (outside the report: nothing there changes). */
    static Path write(URI page, Path file) throws IOException {
        Objects.requireNonNull(page, "page");
        String html = "<!DOCTYPE html>\n<html><head><meta charset=\"utf-8\"><title>probe</title></head><body>\n"
                + "<pre id=\"probe\"></pre>\n"
                + "<iframe id=\"page\" width=\"1200\" height=\"2400\" src=\""
                + StringEscapeUtils.escapeHtml4(page.toString()) + "\"></iframe>\n"
                + "<script>\n" + SCRIPT + "</script>\n</body></html>\n";
        return Files.writeString(file, html);
    }

    /** Reads the probe's findings back from the browser's DOM dump. */
    static Seen read(String dump) {
        Element probe = Jsoup.parse(dump).getElementById("probe");
        if (probe == null) {
            return new Seen(null, List.of(), "no probe element in the dump: " + HeadlessChromium.tail(dump));
        }
        String title = null;
        String error = "";
        List<Image> images = new ArrayList<>();
        for (String line : probe.wholeText().split("\n")) {
            String[] fields = line.split("\t", -1);
            switch (fields[0]) {
                case "title" -> title = fields[1];
                case "img" -> images.add(new Image(fields[1], Boolean.parseBoolean(fields[2]),
                        Boolean.parseBoolean(fields[3]), Integer.parseInt(fields[4]), Integer.parseInt(fields[5])));
                case "error" -> error = fields[1];
                default -> error = "the probe wrote nothing after the page loaded: '" + line + "'";
            }
        }
        return new Seen(title, images, error);
    }
}
