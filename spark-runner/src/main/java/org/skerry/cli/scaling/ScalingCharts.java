package org.skerry.cli.scaling;

import java.awt.BasicStroke;
import java.awt.Color;
import java.awt.Font;
import java.awt.geom.Rectangle2D;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import org.jfree.chart.ChartFactory;
import org.jfree.chart.ChartUtils;
import org.jfree.chart.JFreeChart;
import org.jfree.chart.axis.CategoryLabelPositions;
import org.jfree.chart.axis.NumberAxis;
import org.jfree.chart.plot.CategoryPlot;
import org.jfree.chart.plot.PlotOrientation;
import org.jfree.chart.plot.XYPlot;
import org.jfree.chart.renderer.xy.XYErrorRenderer;
import org.jfree.chart.renderer.xy.XYLineAndShapeRenderer;
import org.jfree.chart.title.TextTitle;
import org.jfree.data.category.DefaultCategoryDataset;
import org.jfree.data.xy.XYSeries;
import org.jfree.data.xy.XYSeriesCollection;
import org.jfree.data.xy.YIntervalSeries;
import org.jfree.data.xy.YIntervalSeriesCollection;
import org.jfree.svg.SVGGraphics2D;
import org.skerry.cli.output.AtomicFile;

/**
 * The study's plots, drawn with JFreeChart and written as PNG and (through JFreeSVG) SVG:
 * speed-up against cores with the ideal line, parallel efficiency against cores, and the time
 * per phase of every point as stacked bars. Each plot carries a title, labelled axes with units,
 * a legend and a subtitle saying what the markers and whiskers are, so it reads without the CSV.
 */
final class ScalingCharts {

    static final int WIDTH = 900;
    static final int HEIGHT = 560;

    /** The phases of the bars, in stacking order, with the CSV column each comes from. */
    static final List<String> PHASES = List.of("evaluate", "reduce", "resample", "redistribute", "move", "checkpoint");

    private ScalingCharts() {
    }

    /** Writes speedup, efficiency and phases as .png and .svg into {@code folder}; returns the files. */
    static List<Path> write(ScalingTable table, Path folder) throws IOException {
        System.setProperty("java.awt.headless", "true");
        List<Path> files = new ArrayList<>();
        files.addAll(save(speedup(table), folder, "speedup"));
        files.addAll(save(efficiency(table), folder, "efficiency"));
        files.addAll(save(phases(table), folder, "phases"));
        return files;
    }

    private static List<Path> save(JFreeChart chart, Path folder, String name) throws IOException {
        Path png = folder.resolve(name + ".png");
        ByteArrayOutputStream bytes = new ByteArrayOutputStream();
        ChartUtils.writeChartAsPNG(bytes, chart, WIDTH, HEIGHT);
        AtomicFile.write(png, out -> bytes.writeTo(out));
        SVGGraphics2D svg = new SVGGraphics2D(WIDTH, HEIGHT);
        chart.draw(svg, new Rectangle2D.Double(0, 0, WIDTH, HEIGHT));
        Path svgFile = folder.resolve(name + ".svg");
        AtomicFile.writeString(svgFile, svg.getSVGDocument());
        return List.of(png, svgFile);
    }

    /** Median and range over repeats of a figure, per group and core count. */
    private static Map<String, TreeMap<Integer, double[]>> byGroup(ScalingTable table, boolean speedup) {
        Map<String, TreeMap<Integer, List<Double>>> values = new LinkedHashMap<>();
        for (ScalingTable.Row row : table.rows()) {
            values.computeIfAbsent(row.point().groupLabel(), g -> new TreeMap<>())
                    .computeIfAbsent(Math.max(1, row.point().cores()), c -> new ArrayList<>())
                    .add(speedup ? row.speedup() : row.efficiency());
        }
        Map<String, TreeMap<Integer, double[]>> out = new LinkedHashMap<>();
        values.forEach((group, perCores) -> {
            TreeMap<Integer, double[]> stats = new TreeMap<>();
            perCores.forEach((cores, list) -> stats.put(cores, Spread.of(list).asArray()));
            out.put(group, stats);
        });
        return out;
    }

    /**
     * One series per group (median with the range as whiskers) and the ideal: k/k₀ for speed-up,
     * 1 for efficiency.
     */
    private static void fill(ScalingTable table, boolean speedup, YIntervalSeriesCollection measured, XYSeries ideal) {
        byGroup(table, speedup).forEach((group, stats) -> {
            YIntervalSeries series = new YIntervalSeries(group);
            stats.forEach((cores, s) -> series.add(cores, s[0], s[1], s[2]));
            measured.addSeries(series);
            int first = stats.firstKey();
            stats.keySet().forEach(cores -> {
                if (ideal.indexOf(cores) < 0) {
                    ideal.add((double) cores, speedup ? (double) cores / first : 1.0);
                }
            });
        });
    }

    private static JFreeChart speedup(ScalingTable table) {
        boolean weak = table.study().scaling() == StudyFile.Scaling.WEAK;
        YIntervalSeriesCollection measured = new YIntervalSeriesCollection();
        XYSeries ideal = new XYSeries("ideal (linear)");
        fill(table, true, measured, ideal);
        String title = table.study().name() + ": " + (weak ? "scaled speed-up (weak scaling)" : "speed-up (strong scaling)");
        JFreeChart chart = ChartFactory.createXYLineChart(title, "cores", weak
                ? "scaled speed-up  k/k\u2080 \u00b7 T(k\u2080)/T(k)  (ratio)" : "speed-up  T(k\u2080)/T(k)  (ratio)",
                measured, PlotOrientation.VERTICAL, true, false, false);
        decorate(chart, table, "markers: median over repeats; whiskers: range over repeats; "
                + "T = sampler loop time; k\u2080 = fewest cores of the group");
        XYPlot plot = chart.getXYPlot();
        plot.setRenderer(0, errorRenderer());
        plot.setDataset(1, new XYSeriesCollection(ideal));
        plot.setRenderer(1, dashed());
        integerCores(plot);
        return chart;
    }

    private static JFreeChart efficiency(ScalingTable table) {
        YIntervalSeriesCollection measured = new YIntervalSeriesCollection();
        XYSeries ideal = new XYSeries("ideal (1.0)");
        fill(table, false, measured, ideal);
        JFreeChart chart = ChartFactory.createXYLineChart(table.study().name() + ": parallel efficiency ("
                + table.study().scaling().name().toLowerCase(java.util.Locale.ROOT) + " scaling)", "cores",
                "parallel efficiency  (fraction of ideal)", measured, PlotOrientation.VERTICAL, true, false, false);
        decorate(chart, table, "markers: median over repeats; whiskers: range over repeats; 1.0 = ideal");
        XYPlot plot = chart.getXYPlot();
        plot.setRenderer(0, errorRenderer());
        plot.setDataset(1, new XYSeriesCollection(ideal));
        plot.setRenderer(1, dashed());
        NumberAxis range = (NumberAxis) plot.getRangeAxis();
        range.setAutoRangeIncludesZero(true);
        integerCores(plot);
        return chart;
    }

    private static JFreeChart phases(ScalingTable table) {
        DefaultCategoryDataset data = new DefaultCategoryDataset();
        Map<String, double[]> sums = new LinkedHashMap<>();
        Map<String, Integer> counts = new LinkedHashMap<>();
        for (ScalingTable.Row row : table.rows()) {
            String label = row.point().values().isEmpty() ? "base" : row.point().label();
            double[] s = sums.computeIfAbsent(label, l -> new double[PHASES.size()]);
            var p = row.m().phases();
            double[] v = {p.evaluate(), row.reduceSeconds(), p.resample(), p.redistribute(), p.move(), p.checkpoint()};
            for (int i = 0; i < v.length; i++) {
                s[i] += v[i];
            }
            counts.merge(label, 1, Integer::sum);
        }
        sums.forEach((label, s) -> {
            for (int i = 0; i < PHASES.size(); i++) {
                data.addValue(s[i] / counts.get(label), PHASES.get(i), label);
            }
        });
        JFreeChart chart = ChartFactory.createStackedBarChart(table.study().name() + ": time per phase of the sampler loop",
                "grid point", "seconds (mean over repeats, summed over iterations)", data, PlotOrientation.VERTICAL,
                true, false, false);
        decorate(chart, table, "reduce = temperature choice + reweighting + moment sums and proposal fit; "
                + "evaluate = initial draw; move = MH steps (likelihood calls)");
        CategoryPlot plot = chart.getCategoryPlot();
        plot.getDomainAxis().setCategoryLabelPositions(CategoryLabelPositions.UP_45);
        plot.getDomainAxis().setMaximumCategoryLabelLines(2);
        return chart;
    }

    private static void decorate(JFreeChart chart, ScalingTable table, String note) {
        chart.setBackgroundPaint(Color.WHITE);
        chart.getTitle().setFont(new Font(Font.SANS_SERIF, Font.BOLD, 16));
        TextTitle subtitle = new TextTitle(note, new Font(Font.SANS_SERIF, Font.PLAIN, 11));
        chart.addSubtitle(subtitle);
        double lowLoad = Double.POSITIVE_INFINITY;
        double highLoad = Double.NEGATIVE_INFINITY;
        for (ScalingTable.Row row : table.rows()) {
            if (row.m().loadAverage() >= 0) {
                lowLoad = Math.min(lowLoad, row.m().loadAverage());
                highLoad = Math.max(highLoad, row.m().loadAverage());
            }
        }
        String load = lowLoad > highLoad ? "" : String.format(java.util.Locale.ROOT,
                "; machine load average %.1f–%.1f at the runs' starts (%d cores)", lowLoad, highLoad,
                Runtime.getRuntime().availableProcessors());
        TextTitle context = new TextTitle(table.study().repeats() + " repeat(s) per point; base run "
                + table.study().base().getFileName() + load, new Font(Font.SANS_SERIF, Font.ITALIC, 11));
        chart.addSubtitle(context);
        if (chart.getPlot() instanceof XYPlot) {
            ((XYPlot) chart.getPlot()).setBackgroundPaint(new Color(248, 248, 248));
        } else if (chart.getPlot() instanceof CategoryPlot) {
            ((CategoryPlot) chart.getPlot()).setBackgroundPaint(new Color(248, 248, 248));
        }
    }

    private static XYErrorRenderer errorRenderer() {
        XYErrorRenderer renderer = new XYErrorRenderer();
        renderer.setDefaultLinesVisible(true);
        renderer.setDefaultShapesVisible(true);
        renderer.setDrawXError(false);
        renderer.setDrawYError(true);
        return renderer;
    }

    private static XYLineAndShapeRenderer dashed() {
        XYLineAndShapeRenderer renderer = new XYLineAndShapeRenderer(true, false);
        renderer.setSeriesPaint(0, Color.GRAY);
        renderer.setSeriesStroke(0, new BasicStroke(1.5f, BasicStroke.CAP_BUTT, BasicStroke.JOIN_MITER, 10f,
                new float[] {6f, 4f}, 0f));
        return renderer;
    }

    private static void integerCores(XYPlot plot) {
        NumberAxis domain = (NumberAxis) plot.getDomainAxis();
        domain.setStandardTickUnits(NumberAxis.createIntegerTickUnits());
        domain.setAutoRangeIncludesZero(false);
        domain.setLowerMargin(0.1);
        domain.setUpperMargin(0.1);
    }
}
