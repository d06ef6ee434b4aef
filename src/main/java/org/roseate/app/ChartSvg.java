package org.roseate.app;

import java.util.ArrayList;
import java.util.List;
import javafx.scene.chart.Axis;
import javafx.scene.chart.NumberAxis;
import javafx.scene.chart.ValueAxis;
import javafx.scene.chart.XYChart;

/**
 * Draws one of the window's charts as SVG from its data (not from its pixels): the title, both axes
 * with ticks, labels and grid lines, and then each series as a polyline (number charts, log or
 * linear frequency axis) or as bars (band charts) with the ± whiskers and design markers a
 * {@link BandChart} carries. The y range is the one the chart shows; an empty or not yet laid-out
 * chart gets the data's own range.
 */
final class ChartSvg {
    static final double WIDTH = 900;
    static final double HEIGHT = 520;
    private static final double LEFT = 72;
    private static final double RIGHT = 24;
    private static final double TOP = 56;
    private static final double BOTTOM = 58;
    /** Series colours, in series order: the window's teal, rose, amber, slate and grey. */
    static final String[] PALETTE = {"#2d6e74", "#b0475a", "#b7791f", "#5b6b8c", "#6b6f76"};
    private static final String FONT = "font-family:sans-serif;font-size:12px;fill:#2a2c30";

    private ChartSvg() {
    }

    /** The chart as an SVG document of {@value #WIDTH} × {@value #HEIGHT} px. */
    static String of(XYChart<?, ?> chart) {
        return of(chart, WIDTH, HEIGHT);
    }

    @SuppressWarnings("unchecked")
    static String of(XYChart<?, ?> chart, double width, double height) {
        SvgWriter svg = new SvgWriter(width, height);
        double x0 = LEFT;
        double x1 = width - RIGHT;
        double y0 = TOP;
        double y1 = height - BOTTOM;
        svg.rect(0, 0, width, height, "background", "fill:#ffffff");
        String title = chart.getTitle() == null ? "" : chart.getTitle();
        svg.text(width / 2, 24, title, "middle", 0, "title", "font-family:sans-serif;font-size:15px;font-weight:bold;fill:#2a2c30");
        Axis<?> xa = chart.getXAxis();
        Axis<?> ya = chart.getYAxis();
        double[] yr = yRange(chart);
        Scale ys = new Scale(yr[0], yr[1], y1, y0, false);
        svg.group("plot-frame", null).rect(x0, y0, x1 - x0, y1 - y0, "frame", "fill:none;stroke:#d9d5cc").end();
        // y ticks and grid
        svg.group("y-axis", FONT);
        for (double t : linearTicks(yr[0], yr[1])) {
            double py = ys.px(t);
            svg.line(x0, py, x1, py, "grid", "stroke:#ece9e3");
            svg.line(x0 - 4, py, x0, py, "tick", "stroke:#6b6f76");
            svg.text(x0 - 7, py + 4, tickLabel(t, yr[1] - yr[0]), "end", 0, "tick-label", null);
        }
        svg.text(18, (y0 + y1) / 2, label(ya), "middle", -90, "axis-label", null);
        svg.end();
        List<String> names = new ArrayList<>();
        if (xa instanceof ValueAxis<?> va) {
            boolean log = xa instanceof LogAxis;
            double lo = va.getLowerBound();
            double hi = va.getUpperBound();
            if (!(hi > lo)) {
                double[] r = xRange((XYChart<Number, Number>) chart);
                lo = r[0];
                hi = r[1];
            }
            Scale xs = new Scale(lo, hi, x0, x1, log);
            svg.group("x-axis", FONT);
            for (Number t : log ? LogAxis.ticks(lo, hi, new double[] {1, 2, 5}) : boxed(linearTicks(lo, hi))) {
                double px = xs.px(t.doubleValue());
                svg.line(px, y0, px, y1, "grid", "stroke:#ece9e3");
                svg.line(px, y1, px, y1 + 4, "tick", "stroke:#6b6f76");
                svg.text(px, y1 + 18, log ? LogAxis.label(t.doubleValue()) : tickLabel(t.doubleValue(), hi - lo), "middle",
                        0, "tick-label", null);
            }
            svg.text((x0 + x1) / 2, height - 14, label(xa), "middle", 0, "axis-label", null);
            svg.end();
            int k = 0;
            for (XYChart.Series<Number, Number> s : ((XYChart<Number, Number>) chart).getData()) {
                String colour = PALETTE[k % PALETTE.length];
                names.add(s.getName());
                List<double[]> pts = new ArrayList<>();
                for (XYChart.Data<Number, Number> d : s.getData()) {
                    double x = d.getXValue().doubleValue();
                    double y = d.getYValue().doubleValue();
                    if (Double.isFinite(x) && Double.isFinite(y) && (!log || x > 0)) {
                        pts.add(new double[] {xs.px(x), ys.px(y)});
                    }
                }
                if (!pts.isEmpty()) {
                    svg.polyline(pts.stream().mapToDouble(p -> p[0]).toArray(), pts.stream().mapToDouble(p -> p[1]).toArray(),
                            "series series-" + k, "fill:none;stroke-width:1.6;stroke:" + colour);
                }
                k++;
            }
        } else {
            XYChart<String, Number> bars = (XYChart<String, Number>) chart;
            List<XYChart.Data<String, Number>> data = bars.getData().isEmpty() ? List.of() : bars.getData().get(0).getData();
            int n = data.size();
            double slot = n == 0 ? 0 : (x1 - x0) / n;
            int every = Math.max(1, (int) Math.ceil(n * 34.0 / (x1 - x0)));
            double base = ys.px(Math.max(yr[0], Math.min(yr[1], 0)));
            double[] whiskers = chart instanceof BandChart b ? b.whiskers() : null;
            double[] markers = chart instanceof BandChart b ? b.markers() : null;
            svg.group("x-axis", FONT);
            for (int i = 0; i < n; i += every) {
                svg.text(x0 + slot * (i + 0.5), y1 + 18, data.get(i).getXValue(), "middle", 0, "tick-label", null);
            }
            svg.text((x0 + x1) / 2, height - 14, label(xa), "middle", 0, "axis-label", null);
            svg.end();
            names.add(bars.getData().isEmpty() ? "" : bars.getData().get(0).getName());
            svg.group("bars", "fill:" + PALETTE[0]);
            for (int i = 0; i < n; i++) {
                double v = data.get(i).getYValue().doubleValue();
                double cx = x0 + slot * (i + 0.5);
                double top = ys.px(v);
                svg.rect(cx - slot * 0.35, Math.min(top, base), slot * 0.7, Math.abs(base - top), "bar", null);
            }
            svg.end();
            if (whiskers != null) {
                svg.group("whiskers", "stroke:#2a2c30;stroke-width:1.2");
                for (int i = 0; i < Math.min(n, whiskers.length); i++) {
                    if (!Double.isFinite(whiskers[i])) {
                        continue;
                    }
                    double v = data.get(i).getYValue().doubleValue();
                    double cx = x0 + slot * (i + 0.5);
                    double hi = ys.px(v + whiskers[i]);
                    double lo = ys.px(v - whiskers[i]);
                    double h = Math.max(2, slot * 0.15);
                    svg.line(cx, hi, cx, lo, "whisker", null);
                    svg.line(cx - h, hi, cx + h, hi, "whisker-cap", null);
                    svg.line(cx - h, lo, cx + h, lo, "whisker-cap", null);
                }
                svg.end();
            }
            if (markers != null) {
                svg.group("design-markers", "stroke:" + PALETTE[1] + ";stroke-width:2.5");
                for (int i = 0; i < Math.min(n, markers.length); i++) {
                    if (Double.isFinite(markers[i])) {
                        double cx = x0 + slot * (i + 0.5);
                        double my = ys.px(markers[i]);
                        svg.line(cx - slot * 0.4, my, cx + slot * 0.4, my, "design-marker", null);
                    }
                }
                svg.end();
                names.add("design");
            }
        }
        if (names.size() > 1) {
            svg.group("legend", FONT);
            double x = x1;
            for (int i = names.size() - 1; i >= 0; i--) {
                String name = names.get(i) == null ? "" : names.get(i);
                double w = 7 * name.length() + 26;
                x -= w;
                svg.rect(x, TOP - 18, 14, 4, "legend-key", "fill:" + PALETTE[i % PALETTE.length]);
                svg.text(x + 18, TOP - 12, name, "start", 0, "legend-label", null);
            }
            svg.end();
        }
        return svg.finish();
    }

    private static String label(Axis<?> a) {
        return a.getLabel() == null ? "" : a.getLabel();
    }

    private static List<Number> boxed(double[] v) {
        List<Number> out = new ArrayList<>();
        for (double d : v) {
            out.add(d);
        }
        return out;
    }

    /** The y range shown: the axis's bounds when laid out, else the data's (with whiskers and markers) padded 5 %. */
    static double[] yRange(XYChart<?, ?> chart) {
        if (chart.getYAxis() instanceof NumberAxis na && na.getUpperBound() > na.getLowerBound() && !chart.getData().isEmpty()
                && chart.getWidth() > 0) {
            return new double[] {na.getLowerBound(), na.getUpperBound()};
        }
        double lo = Double.POSITIVE_INFINITY;
        double hi = Double.NEGATIVE_INFINITY;
        double[] w = chart instanceof BandChart b ? b.whiskers() : null;
        double[] m = chart instanceof BandChart b ? b.markers() : null;
        for (XYChart.Series<?, ?> s : chart.getData()) {
            int i = 0;
            for (XYChart.Data<?, ?> d : s.getData()) {
                double v = ((Number) d.getYValue()).doubleValue();
                double e = w != null && i < w.length && Double.isFinite(w[i]) ? w[i] : 0;
                if (Double.isFinite(v)) {
                    lo = Math.min(lo, v - e);
                    hi = Math.max(hi, v + e);
                }
                if (m != null && i < m.length && Double.isFinite(m[i])) {
                    lo = Math.min(lo, m[i]);
                    hi = Math.max(hi, m[i]);
                }
                i++;
            }
        }
        if (chart instanceof BandChart) {
            lo = Math.min(lo, 0);
            hi = Math.max(hi, 0);
        }
        if (!(hi >= lo)) {
            return new double[] {-1, 1};
        }
        double pad = Math.max(0.05 * (hi - lo), 0.05);
        return new double[] {lo - pad, hi + pad};
    }

    private static double[] xRange(XYChart<Number, Number> chart) {
        double lo = Double.POSITIVE_INFINITY;
        double hi = Double.NEGATIVE_INFINITY;
        for (XYChart.Series<Number, Number> s : chart.getData()) {
            for (XYChart.Data<Number, Number> d : s.getData()) {
                lo = Math.min(lo, d.getXValue().doubleValue());
                hi = Math.max(hi, d.getXValue().doubleValue());
            }
        }
        return hi > lo ? new double[] {lo, hi} : new double[] {20, 20000};
    }

    /** About six ticks at 1, 2 or 5 × 10^k steps covering [lo, hi]. */
    static double[] linearTicks(double lo, double hi) {
        double raw = (hi - lo) / 6;
        double mag = Math.pow(10, Math.floor(Math.log10(raw)));
        double step = raw / mag < 1.5 ? mag : raw / mag < 3.5 ? 2 * mag : raw / mag < 7.5 ? 5 * mag : 10 * mag;
        List<Double> t = new ArrayList<>();
        for (double v = Math.ceil(lo / step) * step; v <= hi + step * 1e-9; v += step) {
            t.add(Math.abs(v) < step * 1e-9 ? 0 : v);
        }
        return t.stream().mapToDouble(Double::doubleValue).toArray();
    }

    private static String tickLabel(double v, double span) {
        int decimals = Math.max(0, (int) Math.ceil(-Math.log10(span / 6)) + 1);
        return ToolText.f("%." + Math.min(decimals, 6) + "f", v).replace("-", "−");
    }

    /** Value to pixel, linear or log10. */
    private record Scale(double lo, double hi, double p0, double p1, boolean log) {
        double px(double v) {
            double a = log ? Math.log10(lo) : lo;
            double b = log ? Math.log10(hi) : hi;
            double x = log ? Math.log10(v) : v;
            return p0 + (x - a) / (b - a) * (p1 - p0);
        }
    }
}
