package org.roseate.plot;

import java.awt.BasicStroke;
import java.awt.Color;
import java.awt.Font;
import java.awt.Rectangle;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.Locale;
import org.jfree.chart.ChartUtils;
import org.jfree.chart.JFreeChart;
import org.jfree.chart.axis.NumberAxis;
import org.jfree.chart.plot.CombinedDomainXYPlot;
import org.jfree.chart.plot.ValueMarker;
import org.jfree.chart.plot.XYPlot;
import org.jfree.chart.renderer.xy.DeviationRenderer;
import org.jfree.chart.renderer.xy.StandardXYBarPainter;
import org.jfree.chart.renderer.xy.XYBarRenderer;
import org.jfree.chart.renderer.xy.XYLineAndShapeRenderer;
import org.jfree.chart.renderer.xy.YIntervalRenderer;
import org.jfree.data.xy.XYIntervalSeries;
import org.jfree.data.xy.XYIntervalSeriesCollection;
import org.jfree.data.xy.XYSeries;
import org.jfree.data.xy.XYSeriesCollection;
import org.jfree.data.xy.YIntervalSeries;
import org.jfree.data.xy.YIntervalSeriesCollection;
import org.jfree.svg.SVGGraphics2D;
import org.roseate.io.AtomicOutput;
import org.roseate.plot.FrequencyChart.BandBars;
import org.roseate.plot.FrequencyChart.Curve;
import org.roseate.plot.FrequencyChart.Envelope;
import org.roseate.plot.FrequencyChart.Panel;

/** Renders a {@link FrequencyChart} with JFreeChart and writes it as PNG or SVG through {@link AtomicOutput}. */
public final class ChartFiles {
    /** Default size, px. */
    public static final int DEFAULT_WIDTH = 1000;
    public static final int DEFAULT_HEIGHT = 700;

    private ChartFiles() {
    }

    /** The output format named by a file's extension: "png" or "svg" (any case); otherwise an exception. */
    public static String formatOf(Path file) {
        String n = file.getFileName().toString().toLowerCase(Locale.ROOT);
        if (n.endsWith(".png")) {
            return "png";
        }
        if (n.endsWith(".svg")) {
            return "svg";
        }
        throw new IllegalArgumentException("plot file '" + file + "' must end in .png or .svg");
    }

    /**
     * Writes the chart to {@code file} (.png or .svg) atomically.
     *
     * @param widthPx  100 … 10000
     * @param heightPx 100 … 10000
     * @param force    replace an existing file
     * @throws IllegalArgumentException for another extension or size
     */
    public static void write(FrequencyChart chart, Path file, int widthPx, int heightPx, boolean force) throws IOException {
        String format = formatOf(file);
        if (widthPx < 100 || widthPx > 10000 || heightPx < 100 || heightPx > 10000) {
            throw new IllegalArgumentException("plot size " + widthPx + "x" + heightPx + " px must be 100 to 10000 each way");
        }
        JFreeChart jc = render(chart);
        try (AtomicOutput out = AtomicOutput.open(file, force)) {
            if (format.equals("png")) {
                ChartUtils.writeChartAsPNG(out.stream(), jc, widthPx, heightPx);
            } else {
                SVGGraphics2D g = new SVGGraphics2D(widthPx, heightPx);
                jc.draw(g, new Rectangle(0, 0, widthPx, heightPx));
                out.stream().write(g.getSVGDocument().getBytes(StandardCharsets.UTF_8));
            }
            out.commit();
        }
    }

    /** The JFreeChart for a chart description (headless). */
    public static JFreeChart render(FrequencyChart chart) {
        System.setProperty("java.awt.headless", "true");
        FrequencyAxis x = new FrequencyAxis();
        CombinedDomainXYPlot plot = new CombinedDomainXYPlot(x);
        plot.setGap(12);
        for (Panel p : chart.panels()) {
            plot.add(panel(p), 1);
        }
        // One legend entry per series: a series drawn in several panels (compare's levels and
        // deviations) has the same name and colour in each, so its first entry stands for all.
        org.jfree.chart.LegendItemCollection unique = new org.jfree.chart.LegendItemCollection();
        java.util.Set<String> seen = new java.util.HashSet<>();
        for (java.util.Iterator<?> it = plot.getLegendItems().iterator(); it.hasNext();) {
            org.jfree.chart.LegendItem item = (org.jfree.chart.LegendItem) it.next();
            if (seen.add(item.getLabel())) {
                unique.add(item);
            }
        }
        plot.setFixedLegendItems(unique);
        JFreeChart jc = new JFreeChart(chart.title(), new Font(Font.SANS_SERIF, Font.BOLD, 16), plot, true);
        jc.setBackgroundPaint(Palette.BACKGROUND);
        return jc;
    }

    private static XYPlot panel(Panel p) {
        NumberAxis y = new NumberAxis(p.yLabel());
        y.setAutoRangeIncludesZero(false);
        XYPlot xy = new XYPlot();
        xy.setRangeAxis(y);
        xy.setBackgroundPaint(Palette.BACKGROUND);
        xy.setDomainGridlinePaint(Palette.GRID);
        xy.setRangeGridlinePaint(Palette.GRID);
        xy.addRangeMarker(new ValueMarker(0, Palette.GRID.darker(), new BasicStroke(1f)));
        int index = 0;
        int colour = 0;

        if (!p.envelopes().isEmpty()) {
            YIntervalSeriesCollection env = new YIntervalSeriesCollection();
            DeviationRenderer r = new DeviationRenderer(true, false);
            r.setAlpha(0.25f);
            for (int k = 0; k < p.envelopes().size(); k++) {
                Envelope e = p.envelopes().get(k);
                YIntervalSeries s = new YIntervalSeries(e.name());
                for (int i = 0; i < e.hz().length; i++) {
                    double mid = e.midDb() != null ? e.midDb()[i] : (e.lowDb()[i] + e.highDb()[i]) / 2;
                    s.add(e.hz()[i], mid, e.lowDb()[i], e.highDb()[i]);
                }
                env.addSeries(s);
                Color c = Palette.series(colour++);
                r.setSeriesPaint(k, c);
                r.setSeriesFillPaint(k, c);
                r.setSeriesStroke(k, new BasicStroke(1.5f));
            }
            xy.setDataset(index, env);
            xy.setRenderer(index++, r);
        }
        if (!p.bars().isEmpty()) {
            XYIntervalSeriesCollection bars = new XYIntervalSeriesCollection();
            YIntervalSeriesCollection whiskers = new YIntervalSeriesCollection();
            XYBarRenderer r = new XYBarRenderer(0.12);
            r.setUseYInterval(true);
            r.setShadowVisible(false);
            r.setBarPainter(new StandardXYBarPainter());
            YIntervalRenderer wr = new YIntervalRenderer();
            int wk = 0;
            for (int k = 0; k < p.bars().size(); k++) {
                BandBars b = p.bars().get(k);
                XYIntervalSeries s = new XYIntervalSeries(b.name());
                for (int i = 0; i < b.lowHz().length; i++) {
                    double mid = Math.sqrt(b.lowHz()[i] * b.highHz()[i]);
                    double v = b.valueDb()[i];
                    s.add(mid, b.lowHz()[i], b.highHz()[i], v, Math.min(0, v), Math.max(0, v));
                }
                bars.addSeries(s);
                Color c = Palette.series(colour++);
                r.setSeriesPaint(k, Palette.translucent(c, 170));
                if (b.whiskerLowDb() != null) {
                    YIntervalSeries ws = new YIntervalSeries(b.name() + " uncertainty");
                    for (int i = 0; i < b.lowHz().length; i++) {
                        ws.add(Math.sqrt(b.lowHz()[i] * b.highHz()[i]), b.valueDb()[i], b.whiskerLowDb()[i], b.whiskerHighDb()[i]);
                    }
                    whiskers.addSeries(ws);
                    wr.setSeriesPaint(wk++, c.darker());
                }
            }
            if (whiskers.getSeriesCount() > 0) {
                xy.setDataset(index, whiskers);
                xy.setRenderer(index++, wr);
            }
            xy.setDataset(index, bars);
            xy.setRenderer(index++, r);
        }
        if (!p.curves().isEmpty()) {
            XYSeriesCollection lines = new XYSeriesCollection();
            XYLineAndShapeRenderer r = new XYLineAndShapeRenderer(true, false);
            for (int k = 0; k < p.curves().size(); k++) {
                Curve c = p.curves().get(k);
                XYSeries s = new XYSeries(c.name(), false, true);
                for (int i = 0; i < c.hz().length; i++) {
                    s.add(c.hz()[i], c.db()[i]);
                }
                lines.addSeries(s);
                if (c.dashed()) {
                    r.setSeriesPaint(k, Palette.TARGET);
                    r.setSeriesStroke(k, new BasicStroke(1.2f, BasicStroke.CAP_BUTT, BasicStroke.JOIN_MITER, 10f,
                            new float[] {6f, 4f}, 0f));
                } else {
                    r.setSeriesPaint(k, Palette.series(colour++));
                    r.setSeriesStroke(k, new BasicStroke(1.8f));
                }
            }
            xy.setDataset(index, lines);
            xy.setRenderer(index, r);
        }
        return xy;
    }
}
