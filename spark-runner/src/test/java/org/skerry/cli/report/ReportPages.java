package org.skerry.cli.report;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.awt.image.BufferedImage;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.List;
import java.util.stream.Stream;
import javax.imageio.ImageIO;
import javax.xml.parsers.DocumentBuilderFactory;
import org.jsoup.Jsoup;
import org.jsoup.nodes.Document;
import org.jsoup.nodes.Element;

/**
 * Checks every report page shares, with libraries outside the project: jsoup parses the page,
 * ImageIO decodes each PNG, the JDK's XML parser (DOCTYPEs refused, so nothing is fetched) reads
 * each SVG. Public: the demo's end-to-end test checks its comparison with it.
 */
public final class ReportPages {

    private ReportPages() {
    }

    /** {@code folder/report/index.html}, parsed. */
    public static Document page(Path folder) throws IOException {
        return Jsoup.parse(folder.resolve("report/index.html").toFile(), "UTF-8");
    }

    /**
     * Every {@code src} and {@code href} of the page is a relative address of a file inside
     * {@code folder} (the run, batch or study folder the report belongs to); no network address,
     * script, external style or CSS {@code url(…)} anywhere. Returns the addressed elements.
     */
    public static List<Element> assertOffline(Path folder) throws IOException {
        Path root = folder.toAbsolutePath().normalize();
        Path report = root.resolve("report");
        String text = Files.readString(report.resolve("index.html"));
        assertFalse(text.contains("http://") || text.contains("https://"), "a network address in the page");
        Document page = page(folder);
        assertTrue(page.select("script, link, iframe, object, embed, base").isEmpty(), "external resources");
        List<Element> addressed = page.select("[src], [href]");
        for (Element element : addressed) {
            String address = element.hasAttr("src") ? element.attr("src") : element.attr("href");
            assertFalse(address.startsWith("//") || address.startsWith("/") || address.contains(":"),
                    "not a relative address: " + address);
            Path target = report.resolve(java.net.URI.create(address).getPath()).normalize();
            assertTrue(target.startsWith(root), address + " leaves " + root);
            assertTrue(Files.isRegularFile(target), address + " is no file (" + target + ")");
        }
        for (Element style : page.select("[style], style")) {
            assertFalse(style.outerHtml().contains("url("), "CSS fetches something: " + style.outerHtml());
        }
        return addressed;
    }

    /** Every PNG in {@code folder/report} decodes to a non-empty image, every SVG parses; returns the count of each. */
    public static int[] assertFiguresRead(Path folder) throws Exception {
        int png = 0;
        int svg = 0;
        try (Stream<Path> files = Files.list(folder.resolve("report"))) {
            for (Path file : files.toList()) {
                String name = file.getFileName().toString();
                if (name.endsWith(".png")) {
                    BufferedImage image = ImageIO.read(file.toFile());
                    assertNotNull(image, name + " decodes");
                    assertTrue(image.getWidth() >= 600 && image.getHeight() >= 300, name + " size");
                    png++;
                } else if (name.endsWith(".svg")) {
                    assertEquals("svg", svg(file).getNodeName(), name);
                    svg++;
                }
            }
        }
        assertEquals(png, svg, "each figure as PNG and SVG");
        return new int[] {png, svg};
    }

    /** The root element of an SVG file. */
    public static org.w3c.dom.Element svg(Path file) throws Exception {
        DocumentBuilderFactory factory = DocumentBuilderFactory.newInstance();
        factory.setFeature("http://apache.org/xml/features/disallow-doctype-decl", true);
        return factory.newDocumentBuilder().parse(file.toFile()).getDocumentElement();
    }

    /** Space-separated numbers, as the data attributes hold them. */
    public static double[] numbers(String text) {
        if (text.isBlank()) {
            return new double[0];
        }
        return Arrays.stream(text.trim().split(" ")).mapToDouble(Double::parseDouble).toArray();
    }

    /** A table cell's exact value, or NaN where the cell holds none (an absent number). */
    public static double value(Element cell) {
        assertNotNull(cell, "missing cell");
        return cell.hasAttr("data-value") ? Double.parseDouble(cell.attr("data-value")) : Double.NaN;
    }
}
