package org.roseate.app;

import javafx.scene.chart.Chart;
import javafx.scene.chart.NumberAxis;
import javafx.scene.chart.XYChart;

/**
 * A level axis chosen from what a JavaFX chart shows, in place of the axis's own auto-ranging
 * (which shows 0–100 with no data and a ±1e-14 dB span for values equal within rounding). The
 * range follows {@link ReadingsChart#levelRange}: the data's span with 6 % to spare, at least
 * {@code minSpanDb} wide, on a 1-2-5 step; with no data, ±minSpanDb/2. Applied by
 * {@link ObservableData#redraw} after every data change of a chart it is installed on.
 */
final class LevelScale {
    private static final String KEY = LevelScale.class.getName();

    private LevelScale() {
    }

    /** Lets the y axis of {@code chart} (a {@link NumberAxis}) follow its data, at least {@code minSpanDb} wide. */
    static void install(XYChart<?, Number> chart, double minSpanDb) {
        if (!(minSpanDb > 0)) {
            throw new IllegalArgumentException("minSpanDb " + minSpanDb);
        }
        chart.getProperties().put(KEY, minSpanDb);
        apply(chart);
    }

    /** Sets the axis of a chart with an installed scale from its data; other charts are left alone. */
    static void apply(Chart chart) {
        if (!(chart instanceof XYChart<?, ?> xy) || !(chart.getProperties().get(KEY) instanceof Double minSpan)
                || !(xy.getYAxis() instanceof NumberAxis y)) {
            return;
        }
        double lo = Double.POSITIVE_INFINITY;
        double hi = Double.NEGATIVE_INFINITY;
        for (XYChart.Series<?, ?> s : xy.getData()) {
            for (XYChart.Data<?, ?> d : s.getData()) {
                if (d.getYValue() instanceof Number n && Double.isFinite(n.doubleValue())) {
                    lo = Math.min(lo, n.doubleValue());
                    hi = Math.max(hi, n.doubleValue());
                }
            }
        }
        double[] r = lo <= hi ? ReadingsChart.levelRange(lo, hi, minSpan, DIVISIONS)
                : ReadingsChart.levelRange(-minSpan / 2, minSpan / 2, minSpan, DIVISIONS);
        set(y, r);
    }

    /** About this many steps over a JavaFX chart's level axis (each step is labelled). */
    static final int DIVISIONS = 4;

    /** Sets {lower, upper, step} on an axis, with labels that never read "-0". */
    static void set(NumberAxis y, double[] r) {
        y.setAutoRanging(false);
        if (!(y.getTickLabelFormatter() instanceof CleanZero)) {
            y.setTickLabelFormatter(new CleanZero());
        }
        ((CleanZero) y.getTickLabelFormatter()).stepDb = r[2];
        y.setLowerBound(r[0]);
        y.setUpperBound(r[1]);
        y.setTickUnit(r[2]);
    }

    /**
     * Tick labels with as many decimals as the step needs; a tick that is zero up to the rounding
     * of adding steps from the lower bound reads "0" (JavaFX's default would print "-0").
     */
    static final class CleanZero extends javafx.util.StringConverter<Number> {
        double stepDb = 1;

        @Override
        public String toString(Number n) {
            double v = n.doubleValue();
            if (Math.abs(v) < stepDb * 1e-6) {
                return "0";
            }
            int decimals = Math.max(0, (int) Math.ceil(-Math.log10(stepDb) - 1e-9));
            return String.format(java.util.Locale.ROOT, "%." + decimals + "f", v);
        }

        @Override
        public Number fromString(String s) {
            return Double.valueOf(s);
        }
    }
}
