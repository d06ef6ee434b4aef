package org.roseate.digital;

import java.util.ArrayList;
import java.util.List;
import org.roseate.digital.UnrenderableModelException.Reason;
import org.roseate.model.Complex;
import org.roseate.model.Zpk;

/**
 * Analog zpk (s in rad/s) to digital zpk by the bilinear map s = 2fs·(z − 1)/(z + 1), that is
 * z = (2fs + s)/(2fs − s), with optional per-root prewarping ({@link PrewarpRule}).
 *
 * <p>Zeros for the difference in degree (the analog zeros at infinity) go to z = −1, as
 * scipy.signal.bilinear_zpk does. Only stable, proper models with a finite non-zero gain are accepted;
 * everything else is refused with an {@link UnrenderableModelException} whose message says what is
 * wrong with the circuit.
 */
public final class Bilinear {
    /** Relative tolerance |Re p| ≤ tol·|p| under which a pole counts as lying on the jω axis. */
    static final double AXIS_TOLERANCE = 1e-12;

    private Bilinear() {
    }

    /** {@link #discretize(Zpk, double, PrewarpRule, double)} with the default rule {@link PrewarpRule#PER_ROOT}. */
    public static DigitalZpk discretize(Zpk analog, double sampleRateHz, double gainMatchHz) {
        return discretize(analog, sampleRateHz, PrewarpRule.PER_ROOT, gainMatchHz);
    }

    /**
     * The digital counterpart of an analog model.
     *
     * <p>Gain: for {@link PrewarpRule#NONE} the gain is scipy's k·Re(∏(2fs − z)/∏(2fs − p)), which makes
     * H_d(e^{jω/fs}) = H_a(j·2fs·tan(ω/(2fs))) on the whole axis, so {@code gainMatchHz} is only
     * range-checked. For {@link PrewarpRule#PER_ROOT} the magnitude is set so that
     * |H_d(e^{j2π·gainMatchHz/fs})| = |H_a(j2π·gainMatchHz)| exactly, with the sign of the prewarped
     * model's scipy gain.
     *
     * @param analog       the analog model (s in rad/s); stable (all poles with Re p &lt; 0), proper, gain finite ≠ 0
     * @param sampleRateHz sample rate fs in Hz, finite and &gt; 0
     * @param rule         prewarping rule
     * @param gainMatchHz  frequency in Hz where the magnitudes are matched, 0 ≤ gainMatchHz &lt; fs/2
     * @return z-plane zeros (mapped zeros, then −1 for each excess pole), poles and gain at {@code sampleRateHz}
     * @throws UnrenderableModelException for a model that cannot run (see {@link UnrenderableModelException.Reason})
     * @throws IllegalArgumentException   for a bad rate or gain-match frequency, or when the match frequency
     *                                    falls on a zero of the model
     */
    public static DigitalZpk discretize(Zpk analog, double sampleRateHz, PrewarpRule rule, double gainMatchHz) {
        if (!(sampleRateHz > 0) || !Double.isFinite(sampleRateHz)) {
            throw new IllegalArgumentException("sampleRateHz=" + sampleRateHz + " must be finite and > 0");
        }
        if (!(gainMatchHz >= 0) || !(gainMatchHz < sampleRateHz / 2)) {
            throw new IllegalArgumentException("gainMatchHz=" + gainMatchHz + " must be in [0, "
                    + sampleRateHz / 2 + ") Hz (below Nyquist)");
        }
        checkRenderable(analog);
        double fs2 = 2 * sampleRateHz;
        List<Complex> zs = new ArrayList<>(analog.zeros().size());
        List<Complex> ps = new ArrayList<>(analog.poles().size());
        for (Complex z : analog.zeros()) {
            zs.add(prewarp(rule, z, sampleRateHz, "zero"));
        }
        for (Complex p : analog.poles()) {
            ps.add(prewarp(rule, p, sampleRateHz, "pole"));
        }
        Complex fs2c = Complex.real(fs2);
        List<Complex> zd = new ArrayList<>(ps.size());
        List<Complex> pd = new ArrayList<>(ps.size());
        Complex num = Complex.ONE;
        Complex den = Complex.ONE;
        for (Complex z : zs) {
            zd.add(fs2c.plus(z).dividedBy(fs2c.minus(z)));
            num = num.times(fs2c.minus(z));
        }
        for (Complex p : ps) {
            pd.add(fs2c.plus(p).dividedBy(fs2c.minus(p)));
            den = den.times(fs2c.minus(p));
        }
        for (int i = zs.size(); i < ps.size(); i++) {
            zd.add(Complex.real(-1));
        }
        double scipyGain = analog.gain() * num.dividedBy(den).re();
        if (rule == PrewarpRule.NONE) {
            return new DigitalZpk(zd, pd, scipyGain, sampleRateHz);
        }
        double analogMag = analog.evaluateAtHz(gainMatchHz).abs();
        double unitMag = new DigitalZpk(zd, pd, 1.0, sampleRateHz).response(gainMatchHz).abs();
        if (!(analogMag > 0) || !(unitMag > 0) || !Double.isFinite(analogMag) || !Double.isFinite(unitMag)) {
            throw new IllegalArgumentException("gainMatchHz=" + gainMatchHz
                    + " falls on a zero of the model; match the gain at another frequency");
        }
        double gain = Math.copySign(analogMag / unitMag, scipyGain);
        return new DigitalZpk(zd, pd, gain, sampleRateHz);
    }

    /**
     * Refuses models that cannot run as a digital filter at any rate: non-finite values, zero gain,
     * more zeros than poles, poles in the right half-plane or on the jω axis.
     *
     * @throws UnrenderableModelException with a one-line message naming the offending root in Hz
     */
    public static void checkRenderable(Zpk analog) {
        double k = analog.gain();
        if (!Double.isFinite(k)) {
            throw new UnrenderableModelException(Reason.NON_FINITE,
                    "the model gain is " + k + ": check the component values");
        }
        if (k == 0) {
            throw new UnrenderableModelException(Reason.ZERO_GAIN,
                    "the model gain is 0: the circuit would be silent");
        }
        for (Complex z : analog.zeros()) {
            if (!z.isFinite()) {
                throw new UnrenderableModelException(Reason.NON_FINITE,
                        "a zero of the model is " + z + ": check the component values");
            }
        }
        for (Complex p : analog.poles()) {
            if (!p.isFinite()) {
                throw new UnrenderableModelException(Reason.NON_FINITE,
                        "a pole of the model is " + p + ": check the component values");
            }
        }
        if (analog.zeros().size() > analog.poles().size()) {
            throw new UnrenderableModelException(Reason.IMPROPER,
                    "the model has more zeros than poles (improper); add the op-amp model (opamp gbwHz)"
                            + " or a series resistor");
        }
        for (Complex p : analog.poles()) {
            double mag = p.abs();
            String where = Hz.format(mag / (2 * Math.PI)) + " Hz";
            boolean pair = p.im() != 0;
            if (p.re() > AXIS_TOLERANCE * mag) {
                throw new UnrenderableModelException(Reason.RIGHT_HALF_PLANE_POLE, pair
                        ? "pole pair at " + where + " is in the right half-plane: the circuit would oscillate"
                        : "pole at " + where + " is in the right half-plane: the circuit would run away"
                                + " (its output grows until it clips)");
            }
            if (p.re() >= -AXIS_TOLERANCE * mag) {
                throw new UnrenderableModelException(Reason.POLE_ON_AXIS, mag == 0
                        ? "pole at 0 Hz (s = 0) is on the jω axis: the circuit is an ideal integrator whose"
                                + " output drifts without limit; give the capacitor a parallel resistor"
                        : "pole pair at " + where + " is on the jω axis: the circuit would ring forever"
                                + " (marginally stable)");
            }
        }
    }

    private static Complex prewarp(PrewarpRule rule, Complex root, double sampleRateHz, String kind) {
        return rule.prewarp(root, sampleRateHz);
    }
}
