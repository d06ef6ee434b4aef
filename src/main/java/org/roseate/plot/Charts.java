package org.roseate.plot;

import java.util.ArrayList;
import java.util.List;
import org.roseate.bands.BandTable;
import org.roseate.compare.BandReading;
import org.roseate.compare.DesignAnalysis;
import org.roseate.compare.LogGrid;
import org.roseate.compare.SlopeFit;
import org.roseate.model.CircuitModel;
import org.roseate.model.FrequencyResponse;
import org.roseate.plot.FrequencyChart.BandBars;
import org.roseate.plot.FrequencyChart.Curve;
import org.roseate.plot.FrequencyChart.Envelope;
import org.roseate.plot.FrequencyChart.Panel;
import org.roseate.tools.ComparedColumn;
import org.roseate.tools.MonteCarlo;

/** The charts of the analyze, compare and tolerance commands, built from their result records. */
public final class Charts {
    private static final int CURVE_POINTS_PER_DECADE = 100;

    private Charts() {
    }

    /**
     * Top: the response in dB and the target line through the same centring offset. Bottom: the
     * pointwise deviation and one bar per band (its centred band deviation).
     */
    public static FrequencyChart analysis(DesignAnalysis a, CircuitModel model) {
        double[] hz = LogGrid.points(a.range().loHz(), a.range().hiHz(), CURVE_POINTS_PER_DECADE);
        FrequencyResponse r = model.response(hz);
        double[] target = new double[hz.length];
        for (int i = 0; i < hz.length; i++) {
            target[i] = a.target().levelDb(hz[i]) - a.slope().offsetDb();
        }
        Panel top = new Panel("Level (dB)", List.of(new Curve(a.name(), hz, r.db(), false),
                new Curve("target " + a.target().describe(), hz, target, true)), List.of(), List.of());
        SlopeFit s = a.slope();
        Panel bottom = new Panel("Deviation from target (dB)",
                List.of(new Curve("pointwise deviation", s.hz(), s.deviationDb(), false)),
                List.of(bars(a.fraction().displayName() + " band deviation", a.bands().readings())), List.of());
        return new FrequencyChart(a.name() + ": response and deviation", List.of(top, bottom));
    }

    /** Top: band levels normalised at 1 kHz, one line per column. Bottom: band deviations. */
    public static FrequencyChart comparison(List<? extends ComparedColumn> columns) {
        List<Curve> levels = new ArrayList<>();
        List<Curve> devs = new ArrayList<>();
        for (ComparedColumn c : columns) {
            List<BandReading> r = c.bands().readings();
            double[] mid = new double[r.size()];
            double[] dev = new double[r.size()];
            for (int i = 0; i < mid.length; i++) {
                mid[i] = r.get(i).band().midHz();
                dev[i] = r.get(i).deviationDb();
            }
            levels.add(new Curve(c.name(), mid, c.normalisedLevelsDb(), false));
            devs.add(new Curve(c.name(), mid, dev, false));
        }
        return new FrequencyChart("Comparison of " + columns.size() + " columns",
                List.of(new Panel("Band level re 1 kHz (dB)", levels, List.of(), List.of()),
                        new Panel("Band deviation from target (dB)", devs, List.of(), List.of())));
    }

    /**
     * The Monte Carlo spread: per band, the 5–95 % envelope of the centred deviation with its
     * median, and the nominal design's deviation as bars.
     */
    public static FrequencyChart tolerance(MonteCarlo.Result r) {
        BandTable t = r.table();
        int n = t.size();
        double[] mid = t.midHz();
        double[] lo = new double[n];
        double[] med = new double[n];
        double[] hi = new double[n];
        double[] nominal = new double[n];
        for (int i = 0; i < n; i++) {
            MonteCarlo.BandSpread b = r.bands().get(i);
            lo[i] = b.deviationDb().p5();
            med[i] = b.deviationDb().p50();
            hi[i] = b.deviationDb().p95();
            nominal[i] = b.nominalDeviationDb();
        }
        Panel p = new Panel("Band deviation from target (dB)", List.of(),
                List.of(BandBars.of("nominal design", t.lowHz(), t.highHz(), nominal)),
                List.of(new Envelope("5–95 % of " + r.spec().trials() + " trials (median line)", mid, lo, med, hi)));
        return new FrequencyChart(r.spec().design().name() + ": tolerance spread", List.of(p));
    }

    private static BandBars bars(String name, List<BandReading> readings) {
        int n = readings.size();
        double[] lo = new double[n];
        double[] hi = new double[n];
        double[] v = new double[n];
        for (int i = 0; i < n; i++) {
            lo[i] = readings.get(i).band().lowHz();
            hi[i] = readings.get(i).band().highHz();
            v[i] = readings.get(i).deviationDb();
        }
        return BandBars.of(name, lo, hi, v);
    }

    /**
     * The chart of {@code measure} in noise-source mode: band levels re the reference band with
     * ±1σ uncertainty whiskers, the target line and, when given, the design's predicted shape; below,
     * each band's centred deviation from the target (when there is one).
     */
    public static FrequencyChart measurement(String name, org.roseate.measure.MeasureResult r) {
        List<org.roseate.measure.BandResult> lv = r.bands();
        int n = lv.size();
        double[] lo = new double[n];
        double[] hi = new double[n];
        double[] mid = new double[n];
        double[] level = new double[n];
        double[] wLo = new double[n];
        double[] wHi = new double[n];
        double[] dev = new double[n];
        double[] target = new double[n];
        int ref = -1;
        for (int i = 0; i < n; i++) {
            var b = lv.get(i).band();
            lo[i] = b.lowHz();
            hi[i] = b.highHz();
            mid[i] = b.midHz();
            level[i] = lv.get(i).normalizedDb();
            double u = lv.get(i).uncertaintyDb();
            wLo[i] = level[i] - (Double.isFinite(u) ? u : 0);
            wHi[i] = level[i] + (Double.isFinite(u) ? u : 0);
            dev[i] = lv.get(i).deviationDb();
            if (b.equals(r.referenceBand())) {
                ref = i;
            }
        }
        var t = r.request().target();
        List<Curve> curves = new ArrayList<>();
        if (t != null) {
            double refTarget = ref < 0 ? 0 : 10 * Math.log10(t.bandPower(lo[ref], hi[ref]));
            for (int i = 0; i < n; i++) {
                target[i] = 10 * Math.log10(t.bandPower(lo[i], hi[i])) - refTarget;
            }
            curves.add(new Curve("target " + t.describe() + " in bands", mid, target, true));
        }
        if (r.hasDesign()) {
            double[] design = new double[n];
            for (int i = 0; i < n; i++) {
                design[i] = level[i] - lv.get(i).designDifferenceDb();
            }
            curves.add(new Curve("design (shape)", mid, design, false));
        }
        Panel top = new Panel("Band level re " + r.referenceBand().label() + " Hz band (dB)", curves,
                List.of(new FrequencyChart.BandBars(name + " (±1σ)", lo, hi, level, wLo, wHi)), List.of());
        if (t == null) {
            return new FrequencyChart(name + ": measured bands", List.of(top));
        }
        Panel bottom = new Panel("Band deviation from target (dB)", List.of(),
                List.of(FrequencyChart.BandBars.of("deviation", lo, hi, dev)), List.of());
        return new FrequencyChart(name + ": measured bands", List.of(top, bottom));
    }
}
