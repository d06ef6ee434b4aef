package org.roseate.plot;

import java.awt.Graphics2D;
import java.awt.geom.Rectangle2D;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.jfree.chart.axis.AxisState;
import org.jfree.chart.axis.LogAxis;
import org.jfree.chart.axis.NumberTick;
import org.jfree.chart.axis.TickType;
import org.jfree.chart.ui.RectangleEdge;
import org.jfree.chart.ui.TextAnchor;

/** A logarithmic frequency axis with ticks at 1, 2, 5 × 10^k Hz labelled "20 Hz", "1 kHz", "20 kHz". */
final class FrequencyAxis extends LogAxis {
    private static final long serialVersionUID = 1L;
    private static final int[] STEPS = {1, 2, 5};

    FrequencyAxis() {
        super("Frequency (Hz)");
        setSmallestValue(1e-3);
    }

    @Override
    @SuppressWarnings({"rawtypes", "unchecked"})
    public List refreshTicks(Graphics2D g2, AxisState state, Rectangle2D dataArea, RectangleEdge edge) {
        List ticks = new ArrayList();
        double lo = getLowerBound();
        double hi = getUpperBound();
        for (int e = (int) Math.floor(Math.log10(lo)); e <= (int) Math.ceil(Math.log10(hi)); e++) {
            for (int s : STEPS) {
                double f = s * Math.pow(10, e);
                if (f >= lo * (1 - 1e-9) && f <= hi * (1 + 1e-9)) {
                    ticks.add(new NumberTick(TickType.MAJOR, f, label(f), TextAnchor.TOP_CENTER, TextAnchor.CENTER, 0));
                }
            }
        }
        return ticks;
    }

    /** "20 Hz", "500 Hz", "1 kHz", "20 kHz", "0.5 Hz". */
    static String label(double hz) {
        if (hz >= 1000) {
            return trim(hz / 1000) + " kHz";
        }
        return trim(hz) + " Hz";
    }

    private static String trim(double v) {
        String s = String.format(Locale.ROOT, "%.3f", v);
        s = s.replaceAll("0+$", "");
        return s.endsWith(".") ? s.substring(0, s.length() - 1) : s;
    }
}
