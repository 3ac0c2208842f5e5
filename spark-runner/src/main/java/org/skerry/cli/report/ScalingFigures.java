package org.skerry.cli.report;

import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.TreeMap;
import org.jfree.chart.JFreeChart;
import org.jfree.chart.LegendItemCollection;
import org.jfree.chart.axis.CategoryAxis;
import org.jfree.chart.axis.CategoryLabelPositions;
import org.jfree.chart.axis.NumberAxis;
import org.jfree.chart.plot.CategoryPlot;
import org.jfree.chart.plot.XYPlot;
import org.jfree.chart.renderer.category.StackedBarRenderer;
import org.jfree.chart.renderer.category.StandardBarPainter;
import org.jfree.chart.renderer.xy.XYErrorRenderer;
import org.jfree.chart.renderer.xy.XYLineAndShapeRenderer;
import org.jfree.data.category.DefaultCategoryDataset;
import org.jfree.data.xy.XYSeries;
import org.jfree.data.xy.XYSeriesCollection;
import org.jfree.data.xy.YIntervalSeries;
import org.jfree.data.xy.YIntervalSeriesCollection;

/**
 * A scaling study's figures in the report's style: speed-up and parallel efficiency against cores
 * per group of points (median over repeats as markers joined by lines, the range over repeats as
 * whiskers, the ideal dashed), and the time per phase of the sampler loop of each point as
 * stacked bars (mean over repeats). Drawn from {@code scaling.csv} alone.
 */
final class ScalingFigures {

    /** The written figures; speed-up and efficiency are null for a study without a cores axis. */
    record Written(FigureFile.Written speedup, FigureFile.Written efficiency, FigureFile.Written phases) {
    }

    private ScalingFigures() {
    }

    static Written write(StudyReport study, Path folder) throws IOException {
        FigureFile.Written speedup = null;
        FigureFile.Written efficiency = null;
        if (study.hasCores()) {
            speedup = FigureFile.write(folder, "speedup", ChartStyle.WIDTH, ChartStyle.HEIGHT,
                    curve(study, true)::draw, data(study, true));
            efficiency = FigureFile.write(folder, "efficiency", ChartStyle.WIDTH, ChartStyle.HEIGHT,
                    curve(study, false)::draw, data(study, false));
        }
        FigureFile.Written phases = FigureFile.write(folder, "phases", ChartStyle.WIDTH, ChartStyle.HEIGHT + 80,
                phases(study)::draw);
        return new Written(speedup, efficiency, phases);
    }

    /** {median, min, max} of speed-up or efficiency per group and core count. */
    static Map<String, TreeMap<Integer, double[]>> byGroup(StudyReport study, boolean speedup) {
        Map<String, TreeMap<Integer, List<Double>>> values = new LinkedHashMap<>();
        for (StudyReport.Run run : study.runs()) {
            values.computeIfAbsent(run.group(), g -> new TreeMap<>())
                    .computeIfAbsent(Math.max(1, run.cores()), c -> new ArrayList<>())
                    .add(speedup ? run.speedup() : run.efficiency());
        }
        Map<String, TreeMap<Integer, double[]>> out = new LinkedHashMap<>();
        values.forEach((group, perCores) -> {
            TreeMap<Integer, double[]> stats = new TreeMap<>();
            perCores.forEach((cores, list) -> stats.put(cores, StudyReport.spread(list)));
            out.put(group, stats);
        });
        return out;
    }

    private static JFreeChart curve(StudyReport study, boolean speedup) {
        boolean weak = "weak".equals(study.scaling());
        YIntervalSeriesCollection measured = new YIntervalSeriesCollection();
        XYSeries ideal = new XYSeries("ideal", true, false);
        XYErrorRenderer renderer = new XYErrorRenderer();
        renderer.setDrawXError(false);
        renderer.setDrawYError(true);
        renderer.setDefaultLinesVisible(true);
        renderer.setDefaultShapesVisible(true);
        renderer.setErrorStroke(ChartStyle.LINE);
        renderer.setCapLength(10);
        LegendItemCollection legend = new LegendItemCollection();
        int k = 0;
        for (Map.Entry<String, TreeMap<Integer, double[]>> group : byGroup(study, speedup).entrySet()) {
            YIntervalSeries series = new YIntervalSeries(group.getKey());
            TreeMap<Integer, double[]> stats = group.getValue();
            stats.forEach((cores, s) -> series.add(cores, s[0], s[1], s[2]));
            measured.addSeries(series);
            renderer.setSeriesPaint(k, Palette.series(k));
            renderer.setSeriesShape(k, ChartStyle.marker(k));
            renderer.setSeriesStroke(k, ChartStyle.LINE);
            legend.add(ChartStyle.markerItem(group.getKey(), Palette.series(k), ChartStyle.marker(k)));
            int first = stats.firstKey();
            stats.keySet().forEach(cores -> {
                if (ideal.indexOf(cores) < 0) {
                    ideal.add((double) cores, speedup ? (double) cores / first : 1.0);
                }
            });
            k++;
        }
        NumberAxis x = new NumberAxis("cores");
        x.setStandardTickUnits(NumberAxis.createIntegerTickUnits());
        x.setAutoRangeIncludesZero(false);
        x.setLowerMargin(0.1);
        x.setUpperMargin(0.1);
        NumberAxis y = new NumberAxis(speedup
                ? (weak ? "scaled speed-up  k/k₀ · T(k₀)/T(k)  (ratio)" : "speed-up  T(k₀)/T(k)  (ratio)")
                : "parallel efficiency  (fraction of ideal)");
        y.setAutoRangeIncludesZero(!speedup);
        XYPlot plot = new XYPlot(measured, x, y, renderer);
        XYLineAndShapeRenderer dashed = new XYLineAndShapeRenderer(true, false);
        dashed.setSeriesPaint(0, Palette.BLACK);
        dashed.setSeriesStroke(0, ChartStyle.DASHED);
        plot.setDataset(1, new XYSeriesCollection(ideal));
        plot.setRenderer(1, dashed);
        legend.add(ChartStyle.lineItem(speedup ? "ideal (linear)" : "ideal (1.0)", Palette.BLACK, ChartStyle.DASHED));
        plot.setFixedLegendItems(legend);
        String title = study.name() + ": " + (speedup ? (weak ? "scaled speed-up" : "speed-up")
                : "parallel efficiency") + " (" + study.scaling().toLowerCase(Locale.ROOT) + " scaling)";
        return ChartStyle.apply(new JFreeChart(title, ChartStyle.TITLE, plot, true), "markers: median over "
                + repeats(study) + "; whiskers: their range; T = sampler loop time, k₀ = fewest cores of the group");
    }

    private static JFreeChart phases(StudyReport study) {
        DefaultCategoryDataset data = new DefaultCategoryDataset();
        study.byPoint().forEach((point, runs) -> {
            for (int i = 0; i < StudyReport.PHASES.size(); i++) {
                double sum = 0;
                for (StudyReport.Run run : runs) {
                    sum += run.phases()[i];
                }
                data.addValue(sum / runs.size(), StudyReport.PHASES.get(i), point);
            }
        });
        StackedBarRenderer renderer = new StackedBarRenderer();
        renderer.setBarPainter(new StandardBarPainter());
        renderer.setShadowVisible(false);
        renderer.setDrawBarOutline(false);
        renderer.setMaximumBarWidth(0.12);
        for (int i = 0; i < StudyReport.PHASES.size(); i++) {
            renderer.setSeriesPaint(i, Palette.series(i));
        }
        CategoryAxis x = new CategoryAxis("grid point");
        x.setCategoryLabelPositions(CategoryLabelPositions.UP_45);
        x.setMaximumCategoryLabelLines(2);
        NumberAxis y = new NumberAxis("seconds (mean over repeats, summed over iterations)");
        CategoryPlot plot = new CategoryPlot(data, x, y, renderer);
        JFreeChart chart = ChartStyle.apply(new JFreeChart(study.name() + ": time per phase of the sampler loop",
                ChartStyle.TITLE, plot, true), "evaluate = initial draw; reduce = temperature, reweighting, proposal fit; "
                + "move = MH steps");
        return chart;
    }

    private static String repeats(StudyReport study) {
        return study.repeats() == 1 ? "1 repeat" : study.repeats() + " repeats";
    }

    private static Map<String, String> data(StudyReport study, boolean speedup) {
        Map<String, String> data = new LinkedHashMap<>();
        List<String> groups = new ArrayList<>();
        StringBuilder cores = new StringBuilder();
        List<Double> medians = new ArrayList<>();
        byGroup(study, speedup).forEach((group, stats) -> {
            stats.forEach((k, s) -> {
                groups.add(group.replace(' ', '_'));
                cores.append(cores.length() == 0 ? "" : " ").append(k);
                medians.add(s[0]);
            });
        });
        data.put("data-groups", String.join(" ", groups));
        data.put("data-cores", cores.toString());
        data.put("data-median", PageParts.numbers(medians.stream().mapToDouble(Double::doubleValue).toArray()));
        return data;
    }
}
