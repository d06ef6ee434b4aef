package org.roseate.app;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import javafx.scene.chart.ValueAxis;

/**
 * A logarithmic frequency axis for JavaFX charts: position ∝ log10(f) between fixed bounds,
 * major ticks on the 1-2-5 sequence of each decade (labelled 20, 50, 100, 200, 500, 1k … 20k),
 * minor ticks on the other integer multiples. No auto-ranging: the bounds are set by the view.
 */
public final class LogAxis extends ValueAxis<Number> {
    private static final double[] MAJOR = {1, 2, 5};

    /**
     * @param lowerHz finite, &gt; 0
     * @param upperHz finite, &gt; lowerHz
     * @throws IllegalArgumentException for bounds that are not 0 &lt; lower &lt; upper
     */
    public LogAxis(String label, double lowerHz, double upperHz) {
        super(lowerHz, upperHz);
        checkBounds(lowerHz, upperHz);
        setLabel(label);
        setAutoRanging(false);
        setMinorTickCount(0);
        setAnimated(false);
    }

    /** Sets both bounds, Hz. */
    public void setBounds(double lowerHz, double upperHz) {
        checkBounds(lowerHz, upperHz);
        setLowerBound(lowerHz);
        setUpperBound(upperHz);
        requestAxisLayout();
    }

    private static void checkBounds(double lo, double hi) {
        if (!(lo > 0) || !(hi > lo) || !Double.isFinite(hi)) {
            throw new IllegalArgumentException("log axis bounds " + lo + " … " + hi + " must satisfy 0 < lower < upper");
        }
    }

    private double length() {
        return getSide() != null && getSide().isVertical() ? getHeight() : getWidth();
    }

    @Override
    public double getDisplayPosition(Number value) {
        double lo = Math.log10(getLowerBound());
        double hi = Math.log10(getUpperBound());
        double v = value.doubleValue();
        double frac = v > 0 ? (Math.log10(v) - lo) / (hi - lo) : Double.NEGATIVE_INFINITY;
        return getSide() != null && getSide().isVertical() ? (1 - frac) * length() : frac * length();
    }

    @Override
    public Number getValueForDisplay(double displayPosition) {
        double lo = Math.log10(getLowerBound());
        double hi = Math.log10(getUpperBound());
        double frac = displayPosition / length();
        if (getSide() != null && getSide().isVertical()) {
            frac = 1 - frac;
        }
        return Math.pow(10, lo + frac * (hi - lo));
    }

    @Override
    public boolean isValueOnAxis(Number value) {
        double v = value.doubleValue();
        return v >= getLowerBound() && v <= getUpperBound();
    }

    @Override
    public double getZeroPosition() {
        return Double.NaN;
    }

    @Override
    protected Object getRange() {
        return new double[] {getLowerBound(), getUpperBound()};
    }

    @Override
    protected void setRange(Object range, boolean animate) {
        double[] r = (double[]) range;
        setLowerBound(r[0]);
        setUpperBound(r[1]);
    }

    @Override
    protected Object autoRange(double minValue, double maxValue, double length, double labelSize) {
        return getRange();
    }

    @Override
    protected List<Number> calculateTickValues(double length, Object range) {
        double[] r = (double[]) range;
        return ticks(r[0], r[1], MAJOR);
    }

    @Override
    protected List<Number> calculateMinorTickMarks() {
        return ticks(getLowerBound(), getUpperBound(), new double[] {3, 4, 6, 7, 8, 9});
    }

    /** The multiples m·10^k (m from {@code mantissas}) within [lo, hi], ascending. */
    static List<Number> ticks(double lo, double hi, double[] mantissas) {
        List<Number> out = new ArrayList<>();
        int k0 = (int) Math.floor(Math.log10(lo));
        int k1 = (int) Math.ceil(Math.log10(hi));
        for (int k = k0; k <= k1; k++) {
            double decade = Math.pow(10, k);
            for (double m : mantissas) {
                double v = m * decade;
                if (v >= lo * (1 - 1e-9) && v <= hi * (1 + 1e-9)) {
                    out.add(v);
                }
            }
        }
        return out;
    }

    @Override
    protected String getTickMarkLabel(Number value) {
        return label(value.doubleValue());
    }

    /** "0.5", "20", "500", "1k", "2k", "20k", "100k": a frequency as a short tick label. */
    static String label(double hz) {
        if (hz >= 1000) {
            return trim(hz / 1000) + "k";
        }
        return trim(hz);
    }

    private static String trim(double v) {
        String s = String.format(Locale.ROOT, "%.3f", v);
        s = s.replaceAll("0+$", "");
        return s.endsWith(".") ? s.substring(0, s.length() - 1) : s;
    }
}
