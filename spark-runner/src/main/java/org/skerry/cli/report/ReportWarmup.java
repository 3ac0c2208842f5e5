package org.skerry.cli.report;

import java.awt.geom.Rectangle2D;
import java.awt.image.BufferedImage;
import java.io.OutputStream;
import java.util.concurrent.atomic.AtomicBoolean;
import org.jfree.chart.JFreeChart;
import org.jfree.chart.axis.NumberAxis;
import org.jfree.chart.plot.XYPlot;
import org.jfree.chart.renderer.xy.XYBarRenderer;
import org.jfree.chart.renderer.xy.XYLineAndShapeRenderer;
import org.jfree.data.xy.XYSeries;
import org.jfree.data.xy.XYSeriesCollection;
import org.jfree.svg.SVGGraphics2D;

/**
 * Loads and initialises, in a background thread while a run starts, what the run's report will
 * draw with: Java 2D, the font system, JFreeChart, the PNG encoder (the deflater) and JFreeSVG. The first
 * report in a JVM otherwise pays for that set-up after the sampling, on the run's critical path;
 * during a run's start-up (mostly one thread loading classes) a second core is idle and the same
 * set-up costs no wall time. It draws a throw-away chart into memory and writes no file, so the
 * report's bytes do not depend on whether it ran; a failure here is ignored, because the report
 * itself will do the same work and report any error then.
 */
public final class ReportWarmup {

    private static final AtomicBoolean STARTED = new AtomicBoolean();

    private ReportWarmup() {
    }

    /** Starts the warm-up once per JVM, in a daemon thread of low priority; returns at once. */
    public static void startInBackground() {
        if (!STARTED.compareAndSet(false, true)) {
            return;
        }
        Thread thread = new Thread(ReportWarmup::drawOnce, "report-warmup");
        thread.setDaemon(true);
        thread.setPriority(Thread.MIN_PRIORITY);
        thread.start();
    }

    private static void drawOnce() {
        try {
            System.setProperty("java.awt.headless", "true");
            XYSeries line = new XYSeries("line");
            XYSeries bars = new XYSeries("bars");
            for (int i = 0; i < 20; i++) {
                line.add(i, Math.sin(i / 3.0));
                bars.add(i, Math.abs(Math.cos(i / 3.0)));
            }
            XYPlot plot = new XYPlot(new XYSeriesCollection(bars), new NumberAxis("x"), new NumberAxis("y"),
                    new XYBarRenderer());
            plot.setDataset(1, new XYSeriesCollection(line));
            plot.setRenderer(1, new XYLineAndShapeRenderer(true, true));
            ChartStyle.xyPlot(plot);
            JFreeChart chart = ChartStyle.apply(new JFreeChart("warm-up", ChartStyle.TITLE, plot, true), "note");
            int width = 300;
            int height = 200;
            BufferedImage image = FigureFile.bitmap(width, height, chart::draw);
            PngFile.write(image, OutputStream.nullOutputStream());
            SVGGraphics2D svg = new SVGGraphics2D(width, height);
            svg.setDefsKeyPrefix("warmup-");
            chart.draw(svg, new Rectangle2D.Double(0, 0, width, height));
            svg.getSVGElement();
        } catch (Throwable ignored) {
            // The report repeats this work and reports its own errors.
        }
    }
}
