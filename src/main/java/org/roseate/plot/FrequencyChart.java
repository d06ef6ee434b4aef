package org.roseate.plot;

import java.util.List;
import java.util.Objects;

/**
 * A chart of one or more panels stacked over a shared logarithmic frequency axis.
 *
 * @param title  the chart title
 * @param panels top to bottom, at least one
 */
public record FrequencyChart(String title, List<Panel> panels) {
    public FrequencyChart {
        Objects.requireNonNull(title, "title");
        panels = List.copyOf(panels);
        if (panels.isEmpty()) {
            throw new IllegalArgumentException("a chart needs at least one panel");
        }
    }

    /**
     * One panel: a y axis and what is drawn against it.
     *
     * @param yLabel    the y-axis label with its unit, e.g. "Level (dB)"
     * @param curves    lines
     * @param bars      band bars
     * @param envelopes shaded ranges
     */
    public record Panel(String yLabel, List<Curve> curves, List<BandBars> bars, List<Envelope> envelopes) {
        public Panel {
            Objects.requireNonNull(yLabel, "yLabel");
            curves = List.copyOf(curves);
            bars = List.copyOf(bars);
            envelopes = List.copyOf(envelopes);
        }
    }

    /**
     * A line through (hz[i], db[i]).
     *
     * @param dashed true for a reference line such as the target
     */
    public record Curve(String name, double[] hz, double[] db, boolean dashed) {
        public Curve {
            check(name, hz, db);
        }
    }

    /**
     * Bars from 0 dB to valueDb over each band [lowHz, highHz], with optional whiskers (for a
     * measured uncertainty): {@code whiskerLowDb}, {@code whiskerHighDb} both null or both given.
     */
    public record BandBars(String name, double[] lowHz, double[] highHz, double[] valueDb, double[] whiskerLowDb,
            double[] whiskerHighDb) {
        public BandBars {
            check(name, lowHz, highHz);
            check(name, lowHz, valueDb);
            if ((whiskerLowDb == null) != (whiskerHighDb == null)) {
                throw new IllegalArgumentException(name + ": give both whisker arrays or neither");
            }
            if (whiskerLowDb != null) {
                check(name, lowHz, whiskerLowDb);
                check(name, lowHz, whiskerHighDb);
            }
        }

        /** Bars without whiskers. */
        public static BandBars of(String name, double[] lowHz, double[] highHz, double[] valueDb) {
            return new BandBars(name, lowHz, highHz, valueDb, null, null);
        }
    }

    /** A shaded range lowDb … highDb at each hz, with an optional centre line {@code midDb} (or null). */
    public record Envelope(String name, double[] hz, double[] lowDb, double[] midDb, double[] highDb) {
        public Envelope {
            check(name, hz, lowDb);
            check(name, hz, highDb);
            if (midDb != null) {
                check(name, hz, midDb);
            }
        }
    }

    private static void check(String name, double[] x, double[] y) {
        Objects.requireNonNull(name, "name");
        if (x.length != y.length) {
            throw new IllegalArgumentException(name + ": " + x.length + " frequencies for " + y.length + " values");
        }
        for (double v : x) {
            if (!(v > 0) || !Double.isFinite(v)) {
                throw new IllegalArgumentException(name + ": frequency " + v + " Hz must be finite and > 0");
            }
        }
    }
}
