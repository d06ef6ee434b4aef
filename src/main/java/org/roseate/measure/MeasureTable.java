package org.roseate.measure;

import java.util.Locale;

/** The plain-text table of a result, as {@code measure} prints it by default. */
public final class MeasureTable {
    private MeasureTable() {
    }

    /** The last path segment of a source name (a device name stays whole). */
    public static String displayName(String source) {
        int i = Math.max(source.lastIndexOf('/'), source.lastIndexOf('\\'));
        return i >= 0 && i < source.length() - 1 ? source.substring(i + 1) : source;
    }

    private static String f(String fmt, Object... args) {
        return String.format(Locale.ROOT, fmt, args);
    }

    private static String hz(double hz) {
        return hz >= 1000 ? f("%.4g kHz", hz / 1000) : f("%.4g Hz", hz);
    }

    private static String pm(Estimate e, String fmt) {
        return Double.isNaN(e.uncertainty()) ? "" : " ± " + f(fmt, e.uncertainty());
    }

    /** The table text, ending with the legend and a newline. */
    public static String of(MeasureResult r) {
        MeasureRequest q = r.request();
        boolean transfer = r.mode() == MeasureMode.TRANSFER;
        StringBuilder sb = new StringBuilder();
        sb.append(f("Capture: %s, %s, segment %d (%.4g Hz bins), %d averages%s%n", displayName(r.source()),
                hz(r.sampleRateHz()), r.segmentLength(), r.resolutionHz(), r.averages(),
                Double.isNaN(r.effectiveSeconds()) ? "" : f(", T_eff %.2f s", r.effectiveSeconds())));
        for (ChannelIntegrity c : r.integrity()) {
            sb.append(f("Channel %d: RMS %.2f dBFS, DC offset %+.3g FS, peak %.4f FS, %d clipped or flat-topped samples%n",
                    c.channel() + 1, c.rmsDbfs(), c.dcOffsetFs(), c.peakFs(), c.clippedSamples()));
        }
        if (transfer) {
            sb.append(f("Transfer from channel %d (reference) to channel %d (response)%s; band level is gain in dB re 1%n",
                    q.referenceChannel() + 1, q.responseChannel() + 1, q.calibration() != null ? ", calibrated" : ""));
        } else {
            sb.append(f("Channel %d, noise-source mode, %s, levels in %s%s%n", q.responseChannel() + 1,
                    q.reader() == BandReader.FILTER_BANK ? "filter bank" : "Welch", r.levelUnit(),
                    q.calibration() != null ? ", calibrated" : ""));
        }
        if (!Double.isNaN(r.calibrationCornerHz())) {
            sb.append(f("Calibration low corner (-1 dB): %.4g Hz%n", r.calibrationCornerHz()));
        }
        if (Double.isNaN(r.slopeDbPerOctave().value())) {
            sb.append(f("Least-squares slope:   — (%d counted bands; it needs two)%n", r.countedBands()));
        } else {
            sb.append(f("Least-squares slope:   %+.3f%s dB/octave%s, over %d counted bands%n", r.slopeDbPerOctave().value(),
                    pm(r.slopeDbPerOctave(), "%.3f"), q.target() == null ? "" : f(" (target %+.3f)", q.target().dbPerOctave()),
                    r.countedBands()));
        }
        if (r.hasTarget()) {
            sb.append(Double.isNaN(r.maxBandDeviationDb().value()) ? f("Peak band deviation:   — (no counted band)%n")
                    : f("Peak band deviation:   %.3f%s dB%n", r.maxBandDeviationDb().value(), pm(r.maxBandDeviationDb(), "%.3f")));
        }
        if (r.hasDesign()) {
            sb.append(f("Against the design:    shape difference, the weighted mean (%+.3f dB) removed%n", r.designOffsetDb()));
        }
        sb.append(f("%n%8s %11s %11s %10s %8s %10s", "band", "low Hz", "high Hz", transfer ? "gain dB" : "level", "±dB",
                "re " + r.referenceBand().label()));
        if (r.hasTarget()) {
            sb.append(f(" %10s", "dev dB"));
        }
        if (r.hasDesign()) {
            sb.append(f(" %10s", "design dB"));
        }
        if (transfer) {
            sb.append(f(" %7s", "γ²"));
        }
        sb.append('\n');
        for (BandResult b : r.bands()) {
            sb.append(f("%8s %11.2f %11.2f %10.3f %8s %+10.3f", b.band().label(), b.band().lowHz(), b.band().highHz(),
                    b.levelDb(), Double.isNaN(b.uncertaintyDb()) ? "—" : f("%.3f", b.uncertaintyDb()), b.normalizedDb()));
            if (r.hasTarget()) {
                sb.append(f(" %+10.3f", b.deviationDb()));
            }
            if (r.hasDesign()) {
                sb.append(f(" %+10.3f", b.designDifferenceDb()));
            }
            if (transfer) {
                sb.append(f(" %7.4f", b.coherence()));
            }
            StringBuilder marks = new StringBuilder();
            if (!b.trusted()) {
                marks.append(" *");
            }
            if (b.toneDominated()) {
                marks.append(" ~");
            }
            if (b.belowCalibrationCorner()) {
                marks.append(" <");
            }
            if (!b.complete()) {
                marks.append(" (cut at Nyquist)");
            }
            sb.append(marks).append('\n');
        }
        if (transfer) {
            sb.append(f("%n%12s %10s %8s %9s %8s %9s %10s %10s%n", "Hz", "dB", "±dB", "deg", "±deg", "γ²", "target dB", "model dB"));
            for (ResponsePoint p : r.points()) {
                sb.append(f("%12.4f %10.3f %8.3f %9.2f %8.2f %9.4f %10s %10s%s%n", p.hz(), p.db(), p.uncertaintyDb(), p.deg(),
                        p.uncertaintyDeg(), p.coherence(), Double.isNaN(p.targetDb()) ? "" : f("%.3f", p.targetDb()),
                        Double.isNaN(p.modelDb()) ? "" : f("%.3f", p.modelDb()), p.trusted() ? "" : " *"));
            }
        }
        sb.append('\n').append(r.legend()).append('\n');
        return sb.toString();
    }
}
