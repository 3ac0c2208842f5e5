package org.skerry.cli.report;

import java.awt.Color;
import java.awt.Font;
import java.awt.FontMetrics;
import java.awt.Graphics2D;
import java.awt.geom.AffineTransform;
import java.awt.geom.Rectangle2D;
import java.io.IOException;
import java.nio.file.Path;
import java.util.List;

/**
 * The pair plot: for the chosen parameters, each one's weighted histogram on the diagonal, the
 * weighted two-dimensional histogram of each pair below it (darker = more posterior mass) and
 * their weighted correlation above. Binned rather than one point per particle, so the files stay
 * a fixed size whatever N is (and the same for the same particles).
 */
final class PairFigure {

    /** Bins per axis of each panel. */
    static final int BINS = 30;

    private static final int LEFT = 120;
    private static final int BOTTOM = 100;
    private static final int TOP = 80;
    private static final int RIGHT = 24;

    private PairFigure() {
    }

    static FigureFile.Written write(RunReport run, PairSelection selection, Path folder) throws IOException {
        List<Integer> chosen = selection.chosen();
        int k = chosen.size();
        int cell = k <= 3 ? 240 : k <= 5 ? 190 : 150;
        int width = LEFT + k * cell + RIGHT;
        int height = TOP + k * cell + BOTTOM;
        WeightedHistogram[] margins = new WeightedHistogram[k];
        int[][] bin = new int[k][];
        for (int a = 0; a < k; a++) {
            double[] v = run.values().get(chosen.get(a));
            margins[a] = WeightedHistogram.of(v, run.weights(), BINS);
            double[] edges = margins[a].edges();
            bin[a] = new int[v.length];
            for (int n = 0; n < v.length; n++) {
                bin[a][n] = Double.isFinite(v[n]) ? WeightedHistogram.binOf(v[n], edges) : -1;
            }
        }
        double[] w = run.weights();
        return FigureFile.write(folder, "pairs", width, height, (g, area) -> {
            title(g, run, selection, width);
            for (int row = 0; row < k; row++) {
                for (int col = 0; col < k; col++) {
                    Rectangle2D box = new Rectangle2D.Double(LEFT + col * cell, TOP + row * cell, cell, cell);
                    if (row == col) {
                        diagonal(g, box, margins[row]);
                    } else if (row > col) {
                        pair(g, box, bin[col], bin[row], w);
                    } else {
                        correlation(g, box, selection.correlation()[chosen.get(row)][chosen.get(col)]);
                    }
                    g.setColor(Palette.GRID);
                    g.draw(box);
                }
            }
            labels(g, run, chosen, margins, cell, k);
        });
    }

    private static void title(Graphics2D g, RunReport run, PairSelection selection, int width) {
        g.setColor(Color.BLACK);
        g.setFont(ChartStyle.TITLE);
        centre(g, "Posterior pairs", width / 2.0, 30);
        g.setFont(ChartStyle.NOTE);
        int d = run.parameters().size();
        String note = (d > selection.chosen().size()
                ? selection.chosen().size() + " of " + d + " parameters, those most correlated with another; "
                : "") + "below: 2-D weighted histograms (" + BINS + "×" + BINS + " bins, darker = more mass); "
                + "above: weighted correlation r";
        centre(g, note, width / 2.0, 56);
    }

    private static void diagonal(Graphics2D g, Rectangle2D box, WeightedHistogram h) {
        double[] mass = h.mass();
        double top = 0;
        for (double m : mass) {
            top = Math.max(top, m);
        }
        double bw = box.getWidth() / h.bins();
        g.setColor(Palette.SKY_BLUE);
        for (int b = 0; b < h.bins(); b++) {
            double bar = top > 0 ? mass[b] / top * (box.getHeight() - 8) : 0;
            g.fill(new Rectangle2D.Double(box.getX() + b * bw, box.getMaxY() - bar, bw, bar));
        }
    }

    private static void pair(Graphics2D g, Rectangle2D box, int[] xBin, int[] yBin, double[] w) {
        double[][] mass = new double[BINS][BINS];
        double top = 0;
        for (int n = 0; n < w.length; n++) {
            if (w[n] > 0 && xBin[n] >= 0 && yBin[n] >= 0) {
                mass[xBin[n]][yBin[n]] += w[n];
                top = Math.max(top, mass[xBin[n]][yBin[n]]);
            }
        }
        double cw = box.getWidth() / BINS;
        double ch = box.getHeight() / BINS;
        for (int x = 0; x < BINS; x++) {
            for (int y = 0; y < BINS; y++) {
                if (mass[x][y] > 0) {
                    g.setColor(Palette.blueShade(mass[x][y] / top));
                    // One pixel of overlap hides the hairline seams anti-aliasing would leave.
                    g.fill(new Rectangle2D.Double(box.getX() + x * cw, box.getMaxY() - (y + 1) * ch, cw + 0.5, ch + 0.5));
                }
            }
        }
    }

    private static void correlation(Graphics2D g, Rectangle2D box, double r) {
        g.setColor(Color.BLACK);
        g.setFont(new Font(Font.SANS_SERIF, Font.PLAIN, Math.abs(r) >= 0.5 ? 20 : 16));
        // Rounded at two decimals, with no "-0.00" for a tiny negative value.
        double shown = Math.abs(r) < 0.005 ? 0 : r;
        centre(g, Double.isNaN(r) ? "r = –" : "r = " + String.format(java.util.Locale.ROOT, "%.2f", shown),
                box.getCenterX(), box.getCenterY());
    }

    private static void labels(Graphics2D g, RunReport run, List<Integer> chosen, WeightedHistogram[] margins, int cell,
            int k) {
        g.setColor(Color.BLACK);
        for (int a = 0; a < k; a++) {
            String name = run.parameters().get(chosen.get(a));
            double[] edges = margins[a].edges();
            String low = Readable.number(edges[0]);
            String high = Readable.number(edges[edges.length - 1]);
            double x = LEFT + a * cell;
            double bottom = TOP + k * cell;
            g.setFont(ChartStyle.TICK);
            FontMetrics m = g.getFontMetrics();
            g.drawString(low, (float) x + 2, (float) bottom + 18);
            g.drawString(high, (float) (x + cell - m.stringWidth(high) - 2), (float) bottom + 36);
            g.setFont(ChartStyle.LABEL);
            centre(g, name, x + cell / 2.0, bottom + 62);
            // Rows: parameter name turned up the left side, its range at the cell's ends.
            double y = TOP + a * cell;
            if (a > 0) {
                g.setFont(ChartStyle.TICK);
                m = g.getFontMetrics();
                g.drawString(low, (float) (LEFT - m.stringWidth(low) - 4), (float) (y + cell - 2));
                g.drawString(high, (float) (LEFT - m.stringWidth(high) - 4), (float) (y + 14));
            }
            g.setFont(ChartStyle.LABEL);
            AffineTransform saved = g.getTransform();
            g.rotate(-Math.PI / 2, 26, y + cell / 2.0);
            centre(g, a == 0 ? name + " (density)" : name, 26, y + cell / 2.0);
            g.setTransform(saved);
        }
    }

    private static void centre(Graphics2D g, String text, double x, double y) {
        FontMetrics m = g.getFontMetrics();
        g.drawString(text, (float) (x - m.stringWidth(text) / 2.0), (float) (y + m.getAscent() / 2.0 - 2));
    }
}
