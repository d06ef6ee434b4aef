package org.roseate.noise;

import java.util.function.DoubleUnaryOperator;

/**
 * The gain that gives filtered white noise a requested RMS level, computed from the filter's
 * noise power gain instead of trial runs.
 *
 * <p>For a unit-variance white input, the output variance of a linear filter is its noise power
 * gain G = Σ h[n]² = (2/fs)·∫₀^{fs/2} |H(f)|² df (Parseval). A target level L dBFS means, per
 * AES17 (full-scale sine = 0 dBFS), an RMS of 10^{L/20}/√2 full scale, so the gain is
 * {@code 10^{L/20} / √(2·G)}.
 */
public final class LevelCalculator {

    /** Relative accuracy the integrator aims for in {@link #noisePowerGain}. */
    public static final double RELATIVE_TOLERANCE = 1e-10;

    /** Lower end of the log-axis part of the integral, as a fraction of fs. */
    static final double LOG_START_FRACTION = 1e-9;

    private static final double SQRT2 = Math.sqrt(2.0);
    /** Upper bound on Gauss–Kronrod panels per call (the adaptive refinement stops there). */
    static final int MAX_PANELS = 20_000;

    // Gauss–Kronrod 7/15 nodes and weights on [−1, 1] (Piessens et al., QUADPACK, 1983).
    private static final double[] XGK = {
        0.991455371120812639206854697526329, 0.949107912342758524526189684047851,
        0.864864423359769072789712788640926, 0.741531185599394439863864773280788,
        0.586087235467691130294144845693013, 0.405845151377397166906606412076961,
        0.207784955007898467600689403773245, 0.000000000000000000000000000000000};
    private static final double[] WGK = {
        0.022935322010529224963732008058970, 0.063092092629978553290700663189204,
        0.104790010322250183839876322541518, 0.140653259715525918745189590510238,
        0.169004726639267902826583426598550, 0.190350578064785409913256402421014,
        0.204432940075298892414161999234649, 0.209482141084727828012999174891714};
    private static final double[] WG = {
        0.129484966168869693270611432679082, 0.279705391489276667901467771423780,
        0.381830050505118944950369775488975, 0.417959183673469387755102040816327};

    private LevelCalculator() {
    }

    /**
     * Gain to apply to unit-variance white noise ahead of (or after) a linear filter so that the
     * output has RMS level {@code levelDbfs} (AES17).
     *
     * @param noisePowerPerUnitVarianceInput the filter's noise power gain G (output variance for a
     *     unit-variance white input), finite, &gt; 0
     * @param levelDbfs target RMS level, dBFS, finite
     * @return linear gain 10^{L/20}/√(2G)
     */
    public static double gainForLevel(double noisePowerPerUnitVarianceInput, double levelDbfs) {
        checkPowerGain(noisePowerPerUnitVarianceInput);
        if (!Double.isFinite(levelDbfs)) {
            throw new IllegalArgumentException("levelDbfs=" + levelDbfs + " must be finite");
        }
        return Math.pow(10.0, levelDbfs / 20.0) / Math.sqrt(2.0 * noisePowerPerUnitVarianceInput);
    }

    /**
     * The inverse of {@link #gainForLevel}: RMS level in dBFS (AES17) of unit-variance white
     * noise through a filter of noise power gain G, scaled by {@code gain}: 20·log10(gain·√(2G)).
     */
    public static double levelDbfs(double noisePowerPerUnitVarianceInput, double gain) {
        checkPowerGain(noisePowerPerUnitVarianceInput);
        return 20.0 * Math.log10(Math.abs(gain) * SQRT2 * Math.sqrt(noisePowerPerUnitVarianceInput));
    }

    /**
     * Noise power gain (2/fs)·∫₀^{fs/2} |H(f)|² df of a filter running at {@code sampleRateHz}, for
     * a unit-variance white input.
     *
     * <p>The integral is split at f₀ = 10⁻⁹·fs: [0, f₀] on a linear axis, [f₀, fs/2] on a log
     * axis (f = eᵘ, df = f·du), so that a large, narrow peak at low frequency (a pole near DC) is
     * resolved. Each part starts from panels of a quarter decade (log part) and is refined by
     * adaptive Gauss–Kronrod 7/15 bisection until the panels' error estimates add up to less than
     * {@link #RELATIVE_TOLERANCE} of a first coarse estimate of the total. For responses that are smooth on the log
     * axis the result is accurate to about 10⁻¹⁰ relative (tests: one-pole responses, closed
     * forms, agree to 1e-9). A feature narrower than a panel that Kronrod points miss entirely
     * (a sharp notch or resonance far from any node) can be under-resolved, and refinement stops
     * after 20000 panels, returning the estimate reached.
     *
     * @param magnitudeSquaredAtHz |H(f)|² at frequency f in Hz, for f in [0, fs/2]; finite, &gt;= 0
     * @param sampleRateHz sample rate fs, Hz, finite, &gt; 0
     * @return G, dimensionless
     */
    public static double noisePowerGain(DoubleUnaryOperator magnitudeSquaredAtHz, double sampleRateHz) {
        if (!(sampleRateHz > 0) || !Double.isFinite(sampleRateHz)) {
            throw new IllegalArgumentException("sampleRateHz=" + sampleRateHz + " must be finite and > 0");
        }
        double nyquistHz = 0.5 * sampleRateHz;
        double startHz = LOG_START_FRACTION * sampleRateHz;
        double uStart = Math.log(startHz);
        double uEnd = Math.log(nyquistHz);
        DoubleUnaryOperator onLogAxis = u -> {
            double f = Math.exp(u);
            return magnitudeSquaredAtHz.applyAsDouble(f) * f;
        };
        double panel = Math.log(10.0) / 4.0;
        int panels = (int) Math.ceil((uEnd - uStart) / panel);
        double[] estimate = new double[2];
        double coarse = 0;
        for (int i = 0; i < panels; i++) {
            kronrod(onLogAxis, panelEdge(uStart, uEnd, i, panels), panelEdge(uStart, uEnd, i + 1, panels), estimate);
            coarse += estimate[0];
        }
        kronrod(magnitudeSquaredAtHz, 0.0, startHz, estimate);
        coarse += estimate[0];
        double absTol = RELATIVE_TOLERANCE * coarse;
        int[] budget = {MAX_PANELS};
        double total = adaptive(magnitudeSquaredAtHz, 0.0, startHz, absTol / (panels + 1), budget);
        for (int i = 0; i < panels; i++) {
            total += adaptive(onLogAxis, panelEdge(uStart, uEnd, i, panels), panelEdge(uStart, uEnd, i + 1, panels),
                    absTol / (panels + 1), budget);
        }
        if (!(total >= 0)) {
            throw new IllegalArgumentException("magnitudeSquaredAtHz gave a negative integral: " + total);
        }
        return total / nyquistHz;
    }

    private static double panelEdge(double uStart, double uEnd, int i, int panels) {
        return i == panels ? uEnd : uStart + (uEnd - uStart) * i / panels;
    }

    private static double adaptive(DoubleUnaryOperator g, double a, double b, double absTol, int[] budget) {
        double[] r = new double[2];
        kronrod(g, a, b, r);
        // stop when accurate, when rounding dominates, or when the panel budget is spent
        if (r[1] <= absTol || r[1] <= 1e-15 * Math.abs(r[0]) || --budget[0] <= 0) {
            return r[0];
        }
        double m = 0.5 * (a + b);
        return adaptive(g, a, m, 0.5 * absTol, budget) + adaptive(g, m, b, 0.5 * absTol, budget);
    }

    /** 15-point Kronrod estimate in out[0], |Kronrod − Gauss| in out[1]. */
    private static void kronrod(DoubleUnaryOperator g, double a, double b, double[] out) {
        double c = 0.5 * (a + b);
        double h = 0.5 * (b - a);
        double fc = g.applyAsDouble(c);
        double k = fc * WGK[7];
        double gauss = fc * WG[3];
        for (int j = 0; j < 7; j++) {
            double dx = h * XGK[j];
            double f1 = g.applyAsDouble(c - dx);
            double f2 = g.applyAsDouble(c + dx);
            k += WGK[j] * (f1 + f2);
            if (j % 2 == 1) {
                gauss += WG[j / 2] * (f1 + f2);
            }
        }
        if (!Double.isFinite(k) || !Double.isFinite(gauss)) {
            throw new IllegalArgumentException("magnitudeSquaredAtHz is not finite on [" + a + ", " + b
                    + "] (Hz, or ln Hz on the log part)");
        }
        out[0] = k * h;
        out[1] = Math.abs((k - gauss) * h);
    }

    private static void checkPowerGain(double g) {
        if (!(g > 0) || !Double.isFinite(g)) {
            throw new IllegalArgumentException("noisePowerPerUnitVarianceInput=" + g + " must be finite and > 0");
        }
    }
}
