package org.skerry.cli.report;

import java.awt.BasicStroke;
import java.awt.Color;
import java.awt.Font;
import java.awt.Paint;
import java.awt.Shape;
import java.awt.Stroke;
import java.awt.geom.Ellipse2D;
import java.awt.geom.Line2D;
import org.jfree.chart.JFreeChart;
import org.jfree.chart.LegendItem;
import org.jfree.chart.axis.ValueAxis;
import org.jfree.chart.plot.XYPlot;
import org.jfree.chart.title.LegendTitle;
import org.jfree.chart.title.TextTitle;
import org.jfree.chart.ui.RectangleEdge;

/**
 * One look for every report chart, sized to stay legible when a 900-pixel figure is printed
 * about 16 cm wide: large type, light background with grid lines, the legend below the plot,
 * and a subtitle saying how to read the figure.
 */
final class ChartStyle {

    static final int WIDTH = 900;
    static final int HEIGHT = 520;

    static final Font TITLE = new Font(Font.SANS_SERIF, Font.BOLD, 20);
    static final Font NOTE = new Font(Font.SANS_SERIF, Font.PLAIN, 14);
    static final Font LABEL = new Font(Font.SANS_SERIF, Font.PLAIN, 16);
    static final Font TICK = new Font(Font.SANS_SERIF, Font.PLAIN, 14);
    static final Font LEGEND = new Font(Font.SANS_SERIF, Font.PLAIN, 14);

    static final Stroke LINE = new BasicStroke(2.5f);
    static final Stroke DASHED = new BasicStroke(2.5f, BasicStroke.CAP_BUTT, BasicStroke.JOIN_MITER, 10f,
            new float[] {8f, 5f}, 0f);
    static final Shape DOT = new Ellipse2D.Double(-3.5, -3.5, 7, 7);

    /** Markers told apart by shape, so series stay distinct in grey print too. */
    private static final Shape[] MARKERS = {
        new Ellipse2D.Double(-5, -5, 10, 10),
        new java.awt.geom.Rectangle2D.Double(-4.5, -4.5, 9, 9),
        new java.awt.Polygon(new int[] {0, 6, -6}, new int[] {-6, 5, 5}, 3),
        new java.awt.Polygon(new int[] {0, 6, 0, -6}, new int[] {-6, 0, 6, 0}, 4),
        new java.awt.Polygon(new int[] {-6, 6, 0}, new int[] {-5, -5, 6}, 3),
    };

    private ChartStyle() {
    }

    /** Applies the look to {@code chart}, adds {@code note} under the title. */
    static JFreeChart apply(JFreeChart chart, String note) {
        chart.setBackgroundPaint(Color.WHITE);
        chart.getTitle().setFont(TITLE);
        if (note != null) {
            chart.addSubtitle(new TextTitle(note, NOTE));
        }
        LegendTitle legend = chart.getLegend();
        if (legend != null) {
            legend.setItemFont(LEGEND);
            legend.setPosition(RectangleEdge.BOTTOM);
        }
        if (chart.getPlot() instanceof XYPlot plot) {
            xyPlot(plot);
        } else if (chart.getPlot() instanceof org.jfree.chart.plot.CategoryPlot plot) {
            plot.setBackgroundPaint(Palette.BACKGROUND);
            plot.setRangeGridlinePaint(Palette.GRID);
            plot.getDomainAxis().setLabelFont(LABEL);
            plot.getDomainAxis().setTickLabelFont(TICK);
            axis(plot.getRangeAxis());
        }
        return chart;
    }

    static void xyPlot(XYPlot plot) {
        plot.setBackgroundPaint(Palette.BACKGROUND);
        plot.setDomainGridlinePaint(Palette.GRID);
        plot.setRangeGridlinePaint(Palette.GRID);
        axis(plot.getDomainAxis());
        for (int i = 0; i < plot.getRangeAxisCount(); i++) {
            axis(plot.getRangeAxis(i));
        }
    }

    static void axis(ValueAxis axis) {
        if (axis != null) {
            axis.setLabelFont(LABEL);
            axis.setTickLabelFont(TICK);
        }
    }

    /** The marker of series {@code i} (from 0): circle, square, triangle, diamond, then again. */
    static Shape marker(int i) {
        return MARKERS[Math.floorMod(i, MARKERS.length)];
    }

    /** A legend entry drawn as a filled box of the given paint, as bars and shaded areas are. */
    static LegendItem boxItem(String label, Paint paint) {
        LegendItem item = new LegendItem(label, paint);
        item.setLabelFont(LEGEND);
        return item;
    }

    /** A legend entry drawn as the given marker. */
    static LegendItem markerItem(String label, Paint paint, Shape shape) {
        LegendItem item = new LegendItem(label, null, null, null, shape, paint);
        item.setLabelFont(LEGEND);
        return item;
    }

    /** A legend entry drawn as a line of the given paint and stroke. */
    static LegendItem lineItem(String label, Paint paint, Stroke stroke) {
        LegendItem item = new LegendItem(label, null, null, null, new Line2D.Double(-9, 0, 9, 0), stroke, paint);
        item.setLabelFont(LEGEND);
        return item;
    }
}
