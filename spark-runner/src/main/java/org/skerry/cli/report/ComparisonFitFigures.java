package org.skerry.cli.report;

import java.awt.Font;
import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.jfree.chart.JFreeChart;
import org.jfree.chart.annotations.XYTitleAnnotation;
import org.jfree.chart.axis.NumberAxis;
import org.jfree.chart.block.BlockBorder;
import org.jfree.chart.plot.CombinedRangeXYPlot;
import org.jfree.chart.plot.XYPlot;
import org.jfree.chart.title.TextTitle;
import org.jfree.chart.ui.RectangleAnchor;
import org.jfree.chart.ui.RectangleInsets;
import org.jfree.data.Range;
import org.skerry.engine.model.predictive.PredictiveSummary;

/**
 * The fits of one dataset under each of its variants side by side: a panel per variant with the
 * observed data over that variant's 50 % and 95 % posterior predictive bands (as
 * {@link FitFigures} draws one run's), every panel on the same axes, so a reader sees at a glance
 * where one variant follows the data and the other does not. Each panel's numbers go into the
 * SVG as {@code data-panel-K-…} attributes (K from 1, left to right).
 */
final class ComparisonFitFigures {

    /** One variant's fit: the variant, its analysis and the posterior predictive summary. */
    record Panel(BatchReport.Row row, PredictiveSummary summary) {
    }

    /** A written comparison: the dataset, its panels left to right, and the files. */
    record Written(String dataset, List<Panel> panels, FigureFile.Written files) {
    }

    private static final Font PANEL_TITLE = new Font(Font.SANS_SERIF, Font.BOLD, 15);

    private ComparisonFitFigures() {
    }

    static Written write(String dataset, int index, List<Panel> panels, Path folder) throws IOException {
        if (panels.size() < 2) {
            throw new IllegalArgumentException("a comparison needs two panels or more, got " + panels.size());
        }
        Map<String, String> data = new LinkedHashMap<>();
        data.put("data-dataset", dataset);
        List<String> variants = new ArrayList<>();
        panels.forEach(p -> variants.add(p.row().variant()));
        data.put("data-variants", String.join(" ", variants));
        for (int k = 0; k < panels.size(); k++) {
            data.putAll(FitFigures.bandData(panels.get(k).summary(), "panel-" + (k + 1) + "-"));
        }
        int width = Math.min(2000, 620 * panels.size());
        return new Written(dataset, List.copyOf(panels), FigureFile.write(folder, String.format("fits-%02d-%s",
                index, FileNames.safe(dataset)), width, ChartStyle.HEIGHT + 60, chart(dataset, panels)::draw, data));
    }

    private static JFreeChart chart(String dataset, List<Panel> panels) {
        PredictiveSummary first = panels.get(0).summary();
        NumberAxis shared = new NumberAxis(FitFigures.label(first.observedQuantity()));
        shared.setAutoRangeIncludesZero(false);
        CombinedRangeXYPlot plot = new CombinedRangeXYPlot(shared);
        plot.setGap(16);
        Range positions = null;
        for (Panel panel : panels) {
            for (double x : panel.summary().positions()) {
                positions = Range.expandToInclude(positions, x);
            }
        }
        int draws = first.draws();
        for (Panel panel : panels) {
            XYPlot sub = FitFigures.bandPlot(panel.summary());
            ChartStyle.xyPlot(sub);
            NumberAxis x = (NumberAxis) sub.getDomainAxis();
            if (positions != null && positions.getLength() > 0) {
                // The same horizontal axis in every panel, whatever each one's own data.
                double margin = 0.04 * positions.getLength();
                x.setRange(positions.getLowerBound() - margin, positions.getUpperBound() + margin);
            }
            BatchReport.Row row = panel.row();
            // An ABC run has no evidence to put in the title: its tolerance instead.
            TextTitle title = new TextTitle("variant " + row.variant() + (row.abc() ? ": ABC, tolerance "
                    + Readable.number(row.finalTolerance()) : ": log Ẑ " + evidence(row)), PANEL_TITLE);
            title.setBackgroundPaint(java.awt.Color.WHITE);
            title.setFrame(new BlockBorder(Palette.GRID));
            title.setPadding(new RectangleInsets(3, 6, 3, 6));
            sub.addAnnotation(new XYTitleAnnotation(0.02, 0.98, title, RectangleAnchor.TOP_LEFT));
            plot.add(sub, 1);
        }
        ChartStyle.axis(shared);
        plot.setFixedLegendItems(FitFigures.bandLegend());
        return ChartStyle.apply(new JFreeChart("Fit against " + dataset + " under each variant", ChartStyle.TITLE,
                plot, true), draws + " replicate datasets per variant from weighted posterior draws; same axes in "
                        + "every panel; about 1 point in 20 should lie outside a 95 % band");
    }

    private static String evidence(BatchReport.Row row) {
        String value = Readable.number(row.logEvidence());
        return Double.isFinite(row.logEvidenceError()) ? value + " ± " + Readable.number(row.logEvidenceError())
                : value + " (error unreliable)";
    }
}
