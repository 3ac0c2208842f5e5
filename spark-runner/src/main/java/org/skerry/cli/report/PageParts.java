package org.skerry.cli.report;

import java.net.URI;
import java.net.URISyntaxException;
import org.apache.commons.text.StringEscapeUtils;
import org.skerry.cli.output.DoubleText;

/**
 * The pieces every report page shares — run, batch and study alike: the document head with the
 * inline style sheet, figures with their PNG and SVG links, table cells that carry the exact
 * value in {@code data-value} beside the readable one, the closing advice, and HTML escaping
 * with Commons Text. One style sheet, so every report looks the same and none fetches anything.
 */
final class PageParts {

    static final String STYLE = """
            body { font-family: sans-serif; max-width: 62rem; margin: 1.5rem auto; padding: 0 1rem; color: #111;
                   line-height: 1.45; }
            h1 { font-size: 1.6rem; } h2 { font-size: 1.3rem; margin-top: 2rem; border-bottom: 1px solid #ccc; }
            h3 { font-size: 1.1rem; }
            .meta { color: #333; }
            ul.notes { list-style: none; padding: 0; }
            ul.notes li { padding: .5rem .75rem; margin: .4rem 0; border-left: .4rem solid #009E73; background: #f3f3f3; }
            ul.notes li.warning { border-left-color: #D55E00; background: #fdf0e6; font-weight: bold; }
            table { border-collapse: collapse; margin: .5rem 0 1rem; }
            th, td { padding: .3rem .6rem; border-bottom: 1px solid #ddd; text-align: right;
                     font-variant-numeric: tabular-nums; }
            th:first-child { text-align: left; }
            td.text { text-align: left; }
            tr.failed td, tr.failed th { background: #fdf0e6; }
            td.reason { text-align: left; font-size: .9rem; color: #333; max-width: 30rem; }
            figure { margin: 1rem 0 2rem; } figure img { max-width: 100%; height: auto; border: 1px solid #eee; }
            figcaption { font-size: .95rem; color: #222; }
            details { margin: .3rem 0 1rem; } summary { cursor: pointer; color: #0072B2; }
            @media print { body { max-width: none; } figure { break-inside: avoid; } }
            """;

    private PageParts() {
    }

    /** The document head up to and including the page's {@code h1}. */
    static void head(StringBuilder html, String title) {
        html.append("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n")
                .append("<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n")
                .append("<title>").append(e(title)).append("</title>\n<style>\n").append(STYLE)
                .append("</style>\n</head>\n<body>\n")
                .append("<h1>").append(e(title)).append("</h1>\n");
    }

    static void end(StringBuilder html) {
        html.append("</body>\n</html>\n");
    }

    /** A note list: warnings (bold, vermillion edge) and passed checks. */
    static void notes(StringBuilder html, java.util.List<Warnings.Note> notes) {
        html.append("<ul class=\"notes\">\n");
        for (Warnings.Note note : notes) {
            html.append("<li class=\"").append(note.warning() ? "warning" : "ok").append("\">")
                    .append(note.warning() ? "Warning: " : "Checked: ").append(e(note.text())).append("</li>\n");
        }
        html.append("</ul>\n");
    }

    static void image(StringBuilder html, FigureFile.Written files, String alt) {
        html.append("<img src=\"").append(e(files.png())).append("\" width=\"").append(files.width())
                .append("\" height=\"").append(files.height()).append("\" alt=\"").append(e(alt)).append("\">\n");
    }

    static void links(StringBuilder html, FigureFile.Written files) {
        html.append("Files: <a href=\"").append(e(files.png())).append("\">PNG</a>, <a href=\"")
                .append(e(files.svg())).append("\">SVG</a>.");
    }

    /** A figure with its image, a caption (escaped here) and the links to its files. */
    static void figure(StringBuilder html, String id, FigureFile.Written files, String alt, String caption) {
        html.append("<figure id=\"").append(e(id)).append("\">\n");
        image(html, files, alt);
        html.append("<figcaption>").append(e(caption)).append(' ');
        links(html, files);
        html.append("</figcaption>\n</figure>\n");
    }

    /** A number cell: readable text, the exact value in {@code data-value}; an absent value (NaN) shows {@code absent}. */
    static String cell(String key, double value, String absent) {
        if (Double.isNaN(value)) {
            return "<td data-key=\"" + e(key) + "\">" + e(absent) + "</td>";
        }
        return cell(key, value);
    }

    static String cell(String key, double value) {
        return "<td data-key=\"" + e(key) + "\" data-value=\"" + DoubleText.format(value) + "\">"
                + e(Readable.number(value)) + "</td>";
    }

    /** A whole-number cell; a negative count (unknown) shows {@code –}. */
    static String countCell(String key, long value) {
        if (value < 0) {
            return "<td data-key=\"" + e(key) + "\">–</td>";
        }
        return "<td data-key=\"" + e(key) + "\" data-value=\"" + value + "\">" + e(Readable.count(value)) + "</td>";
    }

    /** The advice that closes every report. */
    static void reading(StringBuilder html, String what) {
        html.append("<section id=\"reading\">\n<h2>Before a decision rests on this ").append(e(what)).append("</h2>\n")
                .append("""
                <p>Every number here is an estimate with Monte Carlo error, and these pages cannot show a mode the \
                moves never reached. Repeat the runs with other seeds and a larger N and compare; compare model \
                variants by their evidence only where the difference is several combined errors; check the fit \
                against the data. Conclusions that matter need an independent review of the model, the data and \
                these results.</p>
                </section>
                """);
    }

    /** Numbers separated by spaces, each in the exact text of the output files. */
    static String numbers(double[] values) {
        StringBuilder out = new StringBuilder();
        for (double v : values) {
            out.append(out.length() == 0 ? "" : " ").append(DoubleText.format(v));
        }
        return out.toString();
    }

    /**
     * A relative address of a path made of folder names ({@code ../buoy-07/sigmoidal/report/index.html}),
     * each segment percent-encoded where a URL needs it.
     */
    static String address(String relativePath) {
        try {
            return new URI(null, null, relativePath.replace('\\', '/'), null).getRawPath();
        } catch (URISyntaxException ex) {
            throw new IllegalArgumentException("not a relative path: " + relativePath, ex);
        }
    }

    static String e(String text) {
        return StringEscapeUtils.escapeHtml4(text);
    }
}
