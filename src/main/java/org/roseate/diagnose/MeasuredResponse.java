package org.roseate.diagnose;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import org.roseate.measure.MeasureMode;
import org.roseate.measure.MeasureResult;
import org.roseate.measure.ResponsePoint;
import org.roseate.sweep.SweepPoint;
import org.roseate.sweep.SweepResult;
import org.roseate.sweep.SweepUncertainty;

/**
 * A measured response ready for diagnosis: one entry per analysis point, magnitude always, phase
 * where the measurement has one. Immutable; arrays are copied in and out. Built from the measurement
 * core's result ({@link #of(MeasureResult, String)}) or from a swept-sine result
 * ({@link #of(SweepResult, double, double, String)}); the diagnosis never sees samples.
 *
 * @param sampleRateHz   fs of the capture, Hz (only reported)
 * @param hz             point frequencies, Hz, ascending, each finite and &gt; 0
 * @param measuredDb     measured level per point, dB: 20·log10|H| for a transfer capture, or
 *                       10·log10 of the power density for a noise-source capture (any reference)
 * @param uncertaintyDb  standard uncertainty (one standard deviation) of each measured level, dB,
 *                       finite and &gt; 0 where trusted
 * @param measuredDeg    arg H per point, degrees, or NaN where no phase was measured (noise sources)
 * @param uncertaintyDeg standard uncertainty of measuredDeg, degrees; NaN where there is no phase
 * @param trusted        whether each point may enter the fit (for transfer captures: coherence at or
 *                       above the threshold); untrusted points are shown but never fitted
 * @param levelFree      true when the overall level is unknown (a noise source of unknown level):
 *                       the fit then adds a free offset in dB to the model
 * @param description    one line saying what was measured, for reports
 * @param binHz          the bin width of the Hann-windowed FFT the estimates come from, Hz: each is
 *                       the response averaged over the window's kernel, which the fit's model
 *                       reproduces; 0 for estimates with no such smoothing (a swept sine). Every
 *                       point must lie above one bin.
 */
public record MeasuredResponse(double sampleRateHz, double[] hz, double[] measuredDb, double[] uncertaintyDb,
        double[] measuredDeg, double[] uncertaintyDeg, boolean[] trusted, boolean levelFree, String description,
        double binHz) {
    /**
     * Floor of a magnitude uncertainty, 0.005 dB, combined in quadrature: it keeps weights finite where
     * the random error goes to zero (γ² → 1) and covers the H1 estimate's leakage bias, well below
     * this for RC responses at the resolutions used (common practice).
     */
    public static final double FLOOR_DB = 0.005;
    /**
     * Floor of a phase uncertainty, degrees: the same relative complex error as {@link #FLOOR_DB},
     * ln(10)/20·0.005 rad = 0.033°.
     */
    public static final double FLOOR_DEG = Math.toDegrees(Math.log(10) / 20 * FLOOR_DB);

    /** @throws IllegalArgumentException on mismatched lengths, bad frequencies or uncertainties */
    public MeasuredResponse {
        hz = hz.clone();
        measuredDb = measuredDb.clone();
        uncertaintyDb = uncertaintyDb.clone();
        measuredDeg = measuredDeg.clone();
        uncertaintyDeg = uncertaintyDeg.clone();
        trusted = trusted.clone();
        int n = hz.length;
        if (measuredDb.length != n || uncertaintyDb.length != n || trusted.length != n || measuredDeg.length != n
                || uncertaintyDeg.length != n) {
            throw new IllegalArgumentException("hz, measuredDb, uncertaintyDb, measuredDeg, uncertaintyDeg and trusted "
                    + "must have the same length");
        }
        for (int i = 0; i < n; i++) {
            if (!(hz[i] > 0) || !Double.isFinite(hz[i]) || i > 0 && !(hz[i] > hz[i - 1])) {
                throw new IllegalArgumentException("hz must be finite, > 0 and ascending; hz[" + i + "]=" + hz[i]);
            }
            if (trusted[i] && (!Double.isFinite(measuredDb[i]) || !(uncertaintyDb[i] > 0)
                    || !Double.isFinite(uncertaintyDb[i]))) {
                throw new IllegalArgumentException("trusted point " + i + " needs a finite level and an uncertainty > 0");
            }
            if (Double.isFinite(measuredDeg[i]) != (uncertaintyDeg[i] > 0 && Double.isFinite(uncertaintyDeg[i]))) {
                throw new IllegalArgumentException("point " + i + " needs a phase and its uncertainty > 0, or neither");
            }
        }
        if (!(binHz >= 0) || !Double.isFinite(binHz) || n > 0 && !(hz[0] > binHz)) {
            throw new IllegalArgumentException("binHz=" + binHz + " must be finite, ≥ 0 and below every point");
        }
        if (levelFree && hasPhase(measuredDeg)) {
            throw new IllegalArgumentException("a response of unknown level is a noise source's and has no phase");
        }
    }

    /** A magnitude-only response (no phase at any point) of exact values (no window smoothing). */
    public MeasuredResponse(double sampleRateHz, double[] hz, double[] measuredDb, double[] uncertaintyDb,
            boolean[] trusted, boolean levelFree, String description) {
        this(sampleRateHz, hz, measuredDb, uncertaintyDb, nan(hz.length), nan(hz.length), trusted, levelFree,
                description, 0);
    }

    /**
     * The response the measurement core found: transfer points (|H| and phase with their ± from
     * coherence and averages; trusted as the core marks them) or noise-source density points (level
     * free, no phase). The core states ± as 20·log10(1 + ε) (or 10·log10 for a power); here ε is taken
     * back out and used to first order, σ = 20/ln10·ε dB (10/ln10·ε for a power), the symmetric
     * standard deviation a least-squares weight needs, combined in quadrature with {@link #FLOOR_DB}
     * (and {@link #FLOOR_DEG} for the phase).
     *
     * @throws IllegalArgumentException if the result has no response points
     */
    public static MeasuredResponse of(MeasureResult r, String description) {
        List<ResponsePoint> pts = r.points();
        if (pts.isEmpty()) {
            throw new IllegalArgumentException("the measurement was made without response points");
        }
        boolean transfer = r.mode() == MeasureMode.TRANSFER;
        double perDecibel = transfer ? 20 : 10;
        int n = pts.size();
        double[] hz = new double[n];
        double[] db = new double[n];
        double[] u = new double[n];
        double[] deg = nan(n);
        double[] uDeg = nan(n);
        boolean[] trusted = new boolean[n];
        for (int i = 0; i < n; i++) {
            ResponsePoint p = pts.get(i);
            hz[i] = p.hz();
            db[i] = p.db();
            double eps = Math.pow(10, p.uncertaintyDb() / perDecibel) - 1;
            u[i] = Math.hypot(perDecibel / Math.log(10) * eps, FLOOR_DB);
            trusted[i] = p.trusted() && Double.isFinite(p.db()) && Double.isFinite(u[i]);
            if (transfer && trusted[i] && Double.isFinite(p.deg()) && Double.isFinite(p.uncertaintyDeg())) {
                deg[i] = p.deg();
                uDeg[i] = Math.hypot(p.uncertaintyDeg(), FLOOR_DEG);
            }
        }
        return new MeasuredResponse(r.sampleRateHz(), hz, db, u, deg, uDeg, trusted, !transfer, description,
                r.resolutionHz());
    }

    /**
     * A swept-sine transfer result between loHz and hiHz: points whose magnitude the sweep's noise
     * allows, with σ from {@link SweepUncertainty} (floored as {@link #of(MeasureResult, String)});
     * phase only when a reference channel was recorded (without one the bulk delay was removed, so
     * the phase is not the circuit's).
     *
     * @throws IllegalArgumentException if no point lies in the band
     */
    public static MeasuredResponse of(SweepResult r, double loHz, double hiHz, String description) {
        List<double[]> rows = new ArrayList<>();
        for (SweepPoint p : r.points()) {
            if (p.hz() < loHz * (1 - 1e-12) || p.hz() > hiHz * (1 + 1e-12)) {
                continue;
            }
            double u = SweepUncertainty.magnitudeDb(r.spec(), p);
            boolean ok = Double.isFinite(p.magnitudeDb()) && Double.isFinite(u);
            double uDeg = SweepUncertainty.phaseDeg(r.spec(), p);
            boolean phase = ok && r.referenceGiven() && Double.isFinite(p.phaseDeg()) && Double.isFinite(uDeg);
            rows.add(new double[] {p.hz(), ok ? p.magnitudeDb() : Double.NaN, ok ? Math.hypot(u, FLOOR_DB) : Double.NaN,
                phase ? p.phaseDeg() : Double.NaN, phase ? Math.hypot(uDeg, FLOOR_DEG) : Double.NaN, ok ? 1 : 0});
        }
        if (rows.isEmpty()) {
            throw new IllegalArgumentException("no swept-sine point lies in the analysed band");
        }
        int n = rows.size();
        double[][] c = new double[6][n];
        boolean[] trusted = new boolean[n];
        for (int i = 0; i < n; i++) {
            for (int k = 0; k < 6; k++) {
                c[k][i] = rows.get(i)[k];
            }
            trusted[i] = rows.get(i)[5] > 0;
        }
        return new MeasuredResponse(r.spec().sampleRateHz(), c[0], c[1], c[2], c[3], c[4], trusted, false, description, 0);
    }

    private static double[] nan(int n) {
        double[] a = new double[n];
        Arrays.fill(a, Double.NaN);
        return a;
    }

    private static boolean hasPhase(double[] deg) {
        for (double d : deg) {
            if (Double.isFinite(d)) {
                return true;
            }
        }
        return false;
    }

    /** True when at least one point carries a phase. */
    public boolean hasPhase() {
        return hasPhase(measuredDeg);
    }

    /** This response with the phase left out (magnitude only). */
    public MeasuredResponse withoutPhase() {
        return new MeasuredResponse(sampleRateHz, hz, measuredDb, uncertaintyDb, nan(hz.length), nan(hz.length), trusted,
                levelFree, description, binHz);
    }

    @Override
    public double[] hz() {
        return hz.clone();
    }

    @Override
    public double[] measuredDb() {
        return measuredDb.clone();
    }

    @Override
    public double[] uncertaintyDb() {
        return uncertaintyDb.clone();
    }

    @Override
    public double[] measuredDeg() {
        return measuredDeg.clone();
    }

    @Override
    public double[] uncertaintyDeg() {
        return uncertaintyDeg.clone();
    }

    @Override
    public boolean[] trusted() {
        return trusted.clone();
    }

    /** Number of points. */
    public int size() {
        return hz.length;
    }

    /** Number of trusted points. */
    public int trustedCount() {
        int c = 0;
        for (boolean t : trusted) {
            c += t ? 1 : 0;
        }
        return c;
    }
}
