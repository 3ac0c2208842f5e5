package org.skerry.cli.report;

import java.awt.Color;
import java.awt.Graphics2D;
import java.awt.RenderingHints;
import java.awt.geom.Rectangle2D;
import java.awt.image.BufferedImage;
import java.io.IOException;
import java.nio.file.Path;
import org.jfree.svg.SVGGraphics2D;
import org.skerry.cli.output.AtomicFile;

/**
 * Writes one figure as {@code NAME.png} and {@code NAME.svg}, each atomically: the same drawing
 * goes once onto a bitmap and once through JFreeSVG, so the two files show the same thing.
 */
final class FigureFile {

    /** Draws a figure into the given area. A JFreeChart's {@code draw} fits as it is. */
    @FunctionalInterface
    interface Drawing {
        void draw(Graphics2D g, Rectangle2D area);
    }

    /** A written figure: its file names (relative to the report folder), size and description. */
    record Written(String png, String svg, int width, int height) {
    }

    private FigureFile() {
    }

    static Written write(Path folder, String name, int width, int height, Drawing drawing) throws IOException {
        return write(folder, name, width, height, drawing, java.util.Map.of());
    }

    /**
     * As {@link #write(Path, String, int, int, Drawing)}, with {@code data-*} attributes on the
     * SVG's root element: the numbers behind the figure, readable without the picture.
     */
    static Written write(Path folder, String name, int width, int height, Drawing drawing,
            java.util.Map<String, String> svgAttributes) throws IOException {
        BufferedImage image = bitmap(width, height, drawing);
        String png = name + ".png";
        AtomicFile.write(folder.resolve(png), out -> PngFile.write(image, out));
        SVGGraphics2D svg = new SVGGraphics2D(width, height);
        // The default prefix holds the clock; a fixed one makes the same figure the same bytes.
        svg.setDefsKeyPrefix(name + "-");
        svg.setColor(Color.WHITE);
        svg.fillRect(0, 0, width, height);
        drawing.draw(svg, new Rectangle2D.Double(0, 0, width, height));
        String svgName = name + ".svg";
        // The element alone: the full document's DOCTYPE points at a DTD on the network, which a
        // validating reader would try to fetch; the report must open offline.
        String element = svg.getSVGElement();
        StringBuilder attributes = new StringBuilder();
        svgAttributes.forEach((key, value) -> {
            if (!key.startsWith("data-")) {
                throw new IllegalArgumentException("SVG attribute must be a data- attribute, was " + key);
            }
            attributes.append(' ').append(key).append("=\"")
                    .append(org.apache.commons.text.StringEscapeUtils.escapeXml10(value)).append('"');
        });
        element = element.replaceFirst("^<svg", "<svg" + java.util.regex.Matcher.quoteReplacement(attributes.toString()));
        AtomicFile.writeString(folder.resolve(svgName), "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n"
                + element + "\n");
        return new Written(png, svgName, width, height);
    }

    /** The drawing on a white, antialiased bitmap of the given size: what the PNG file holds. */
    static BufferedImage bitmap(int width, int height, Drawing drawing) {
        BufferedImage image = new BufferedImage(width, height, BufferedImage.TYPE_INT_RGB);
        Graphics2D g = image.createGraphics();
        try {
            g.setRenderingHint(RenderingHints.KEY_ANTIALIASING, RenderingHints.VALUE_ANTIALIAS_ON);
            g.setRenderingHint(RenderingHints.KEY_TEXT_ANTIALIASING, RenderingHints.VALUE_TEXT_ANTIALIAS_ON);
            g.setColor(Color.WHITE);
            g.fillRect(0, 0, width, height);
            drawing.draw(g, new Rectangle2D.Double(0, 0, width, height));
        } finally {
            g.dispose();
        }
        return image;
    }
}
