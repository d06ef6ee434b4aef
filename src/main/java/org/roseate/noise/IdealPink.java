package org.roseate.noise;

import java.util.ArrayList;
import java.util.List;
import org.roseate.model.Complex;
import org.roseate.model.Zpk;

/**
 * The reference "ideal" fractional-slope response that a circuit design is heard and measured
 * against: an analog zpk whose magnitude follows a straight line of {@code dbPerOctave} on a log
 * frequency axis (pink: −10·log10(2) = −3.0103 dB/octave, power density ∝ 1/f), within a stated
 * ripple, over the band of interest, and flattens outside it.
 *
 * <p><b>Construction.</b> A ladder of real poles and zeros with constant ratio spacing — the
 * classic way to approximate a fractional slope with first-order sections (common practice in
 * pink-noise filters). With slope fraction α = dbPerOctave / (20·log10 2) in (−1, 1), step
 * d (nepers of frequency, ratio r = e^d between neighbouring poles) and δ = |α|·d: for α &lt; 0
 * each pole at f₀·rⁱ is followed by a zero at f₀·rⁱ·e^δ (for pink a zero half-way, at √r);
 * for α &gt; 0 zero and pole swap places. On average each period of length d in ln f loses δ
 * nepers of ln|H|, so the mean slope is exactly α.
 *
 * <p><b>Ripple (derived).</b> Write u = ln f. Each element adds ±½·ln(1 + e^{2(u − c)}), whose
 * second derivative is 1/(2·cosh²(u − c)) with Fourier transform (πω/2)/sinh(πω/2). Summing the
 * infinite ladder by Poisson's formula, the mean term gives the slope α and the first harmonic
 * gives a sinusoidal ripple in u of period d and amplitude
 * <pre>  R = sin(π|α|) / sinh(π²/d)  nepers  (×20/ln 10 for dB),</pre>
 * higher harmonics k are smaller by about e^{−(k−1)π²/d}/k. Pink at 2 poles per decade
 * (d = 1.151) gives ±0.0033 dB, at 1 per decade ±0.24 dB. Measured ripple matches R to within a
 * relative 10⁻⁴ for 1, 2 and 3 poles per decade (checked in IdealPinkTest).
 *
 * <p><b>Ends.</b> Truncating the ladder leaves, a distance Δ inside its first pole (or last
 * zero), the error −A₁·e^{−2Δ} + A₂·e^{−4Δ} with A₁ = ½(e^{2δ} − 1)/(e^{2d} − 1) and
 * A₂ = ¼(e^{4δ} − 1)/(e^{4d} − 1) (the tail of missing elements, expanded). Moving the end
 * element outwards by ε = ½·ln(1 − 2A₁) nepers cancels the e^{−2Δ} term, leaving
 * |A₂ − A₁ + A₁²|·e^{−4Δ}. Half of {@code maxRippleDb} goes to the periodic ripple (fixing d) and
 * half to this end residual (fixing Δ); the ladder then spans the covered range plus Δ on each
 * side, rounded up to whole elements and centred. Beyond the ends the response is flat.
 *
 * <p><b>Covered range and guarantee.</b> The pointwise deviation of 20·log10|H| from the exact
 * line (after one common offset) stays within ±{@code maxRippleDb} over
 * [loHz/√2, hiHz·√2] — half an octave beyond each end, so that the octave and third-octave bands
 * centred on loHz and hiHz lie wholly inside. Band levels, being averages, deviate less.
 *
 * <p><b>Default.</b> {@link #DEFAULT_PINK} = {@code design(20, 20000, 0.01)}: 9 real poles and
 * 9 zeros, 1.90 per decade (d = 1.2105, ratio 3.355), lowest pole 3.24 Hz, highest zero
 * 124 kHz (end elements already moved by ε = −0.13 nepers). Achieved (measured by the same
 * evaluation as IdealPinkTest, which asserts the ±0.01 dB bound): pointwise deviation ±0.0055 dB over 14.1 Hz – 28.3 kHz; the 31 IEC 61260-1
 * third-octave band levels 20 Hz – 20 kHz within ±0.0047 dB of the exact pink band levels after a
 * common offset (20 Hz band −0.0045 dB, 20 kHz band +0.0046 dB; a third-octave, 0.23 nepers, is
 * short against the ripple period, so band averaging hardly reduces the ripple); pointwise slope
 * at 1 kHz −2.997 dB/octave (the ripple tilts the local slope by up to (2π/d)·ln2 times its
 * amplitude, here ±0.018 dB/octave).
 *
 * <p>All designs are normalised to |H(j2π·1 kHz)| = 1 (the usual reference frequency for noise
 * spectra, common practice). Poles and zeros are on the negative real axis, in rad/s, as
 * {@link Zpk} requires.
 */
public final class IdealPink {

    /** Exact pink slope, −10·log10(2) dB per octave. */
    public static final double PINK_DB_PER_OCTAVE = -10.0 * Math.log10(2.0);

    /** Slope of one real pole, −20·log10(2) ≈ −6.0206 dB per octave. */
    public static final double FIRST_ORDER_DB_PER_OCTAVE = -20.0 * Math.log10(2.0);

    /** Default pointwise ripple bound, dB. */
    public static final double DEFAULT_RIPPLE_DB = 0.01;

    /** Frequency where every design has unit magnitude, Hz. */
    public static final double REFERENCE_HZ = 1000.0;

    /**
     * Slopes within this distance of ±20·log10 2 dB/octave are taken as exactly first order, so
     * that the customary "6.02 dB per octave" is accepted as a single pole or zero.
     */
    public static final double FIRST_ORDER_SNAP_DB_PER_OCTAVE = 0.005;

    private static final double NEPER_TO_DB = 20.0 / Math.log(10.0);
    private static final double TWO_PI = 2.0 * Math.PI;

    /** Ideal pink over 20 Hz – 20 kHz, ±0.01 dB, |H| = 1 at 1 kHz (declared after the constants it uses). */
    public static final Zpk DEFAULT_PINK = design(20.0, 20000.0, DEFAULT_RIPPLE_DB);

    private IdealPink() {
    }

    /** {@code design(loHz, hiHz, DEFAULT_RIPPLE_DB)}. */
    public static Zpk design(double loHz, double hiHz) {
        return design(loHz, hiHz, DEFAULT_RIPPLE_DB);
    }

    /**
     * An ideal pink (−3.0103 dB/octave) response over loHz..hiHz.
     *
     * @param loHz lower end of the band, Hz, &gt; 0
     * @param hiHz upper end of the band, Hz, &gt; loHz
     * @param maxRippleDb bound on the pointwise deviation from the exact line, dB, in [1e-5, 3]
     * @return zpk with |H(j2π·1 kHz)| = 1
     */
    public static Zpk design(double loHz, double hiHz, double maxRippleDb) {
        return designSlope(PINK_DB_PER_OCTAVE, loHz, hiHz, maxRippleDb);
    }

    /** {@code designSlope(dbPerOctave, loHz, hiHz, DEFAULT_RIPPLE_DB)}. */
    public static Zpk designSlope(double dbPerOctave, double loHz, double hiHz) {
        return designSlope(dbPerOctave, loHz, hiHz, DEFAULT_RIPPLE_DB);
    }

    /**
     * A response of constant slope {@code dbPerOctave} over loHz..hiHz (see the class comment).
     * Slope 0 gives H = 1. A first-order slope (±20·log10 2, within
     * {@link #FIRST_ORDER_SNAP_DB_PER_OCTAVE}) gives: for −6.02, a single pole placed so far
     * below loHz/√2 that its flattening costs at most maxRippleDb there (±maxRippleDb/2 after the
     * common offset); for +6.02, a zero below loHz/√2 and a pole above hiHz·√2, each costing at
     * most maxRippleDb/2, the pole keeping the response proper.
     *
     * @param dbPerOctave slope in dB per octave, in [−6.0206, +6.0206] (plus the snap margin)
     * @param loHz lower end of the band, Hz, &gt; 0
     * @param hiHz upper end of the band, Hz, &gt; loHz
     * @param maxRippleDb bound on the pointwise deviation from the exact line over
     *     [loHz/√2, hiHz·√2], dB, in [1e-5, 3]
     * @return zpk with |H(j2π·1 kHz)| = 1
     */
    public static Zpk designSlope(double dbPerOctave, double loHz, double hiHz, double maxRippleDb) {
        double limit = -FIRST_ORDER_DB_PER_OCTAVE + FIRST_ORDER_SNAP_DB_PER_OCTAVE;
        if (!(Math.abs(dbPerOctave) <= limit)) {
            throw new IllegalArgumentException(
                    "dbPerOctave=" + dbPerOctave + " must be in [" + (-limit) + ", " + limit + "]");
        }
        if (!(loHz > 0) || !Double.isFinite(loHz)) {
            throw new IllegalArgumentException("loHz=" + loHz + " must be finite and > 0");
        }
        if (!(hiHz > loHz) || !Double.isFinite(hiHz)) {
            throw new IllegalArgumentException("hiHz=" + hiHz + " must be finite and > loHz=" + loHz);
        }
        if (!(maxRippleDb >= 1e-5 && maxRippleDb <= 3)) {
            throw new IllegalArgumentException("maxRippleDb=" + maxRippleDb + " must be in [1e-5, 3]");
        }
        double coveredLoHz = loHz / Math.sqrt(2.0);
        double coveredHiHz = hiHz * Math.sqrt(2.0);
        List<Double> polesHz = new ArrayList<>();
        List<Double> zerosHz = new ArrayList<>();
        double alpha = dbPerOctave / -FIRST_ORDER_DB_PER_OCTAVE;
        if (Math.abs(Math.abs(dbPerOctave) + FIRST_ORDER_DB_PER_OCTAVE) <= FIRST_ORDER_SNAP_DB_PER_OCTAVE) {
            firstOrder(dbPerOctave < 0, coveredLoHz, coveredHiHz, maxRippleDb, polesHz, zerosHz);
        } else if (alpha != 0) {
            ladder(alpha, coveredLoHz, coveredHiHz, maxRippleDb, polesHz, zerosHz);
        }
        return normalised(polesHz, zerosHz);
    }

    /**
     * Predicted periodic ripple amplitude of an infinite ladder, dB: 20/ln10 · sin(π|α|)/sinh(π²/d).
     *
     * @param slopeFraction α = dbPerOctave / (20·log10 2), in (−1, 1)
     * @param stepNepers d = ln(ratio between neighbouring poles), &gt; 0
     */
    public static double ladderRippleDb(double slopeFraction, double stepNepers) {
        return NEPER_TO_DB * Math.sin(Math.PI * Math.abs(slopeFraction)) / Math.sinh(Math.PI * Math.PI / stepNepers);
    }

    private static void firstOrder(boolean falling, double coveredLoHz, double coveredHiHz, double maxRippleDb,
            List<Double> polesHz, List<Double> zerosHz) {
        // each element departs from its asymptote by 10·log10(1 + x²) dB at a frequency ratio x;
        // a pole alone may use the whole budget there (±maxRipple/2 after the offset), a
        // zero-pole pair half each, so the bound holds with a factor-2 margin against rounding
        double x = Math.sqrt(Math.pow(10.0, (falling ? maxRippleDb : maxRippleDb / 2.0) / 10.0) - 1.0);
        if (falling) {
            polesHz.add(coveredLoHz * x);
        } else {
            zerosHz.add(coveredLoHz * x);
            polesHz.add(coveredHiHz / x);
        }
    }

    private static void ladder(double alpha, double coveredLoHz, double coveredHiHz, double maxRippleDb,
            List<Double> polesHz, List<Double> zerosHz) {
        double half = maxRippleDb / 2.0;
        double s = Math.sin(Math.PI * Math.abs(alpha));
        // periodic ripple R(d) = s/sinh(π²/d) nepers ≤ half
        double step = Math.PI * Math.PI / asinh(NEPER_TO_DB * s / half);
        double delta = Math.abs(alpha) * step;
        double a1 = 0.5 * Math.expm1(2 * delta) / Math.expm1(2 * step);
        double a2 = 0.25 * Math.expm1(4 * delta) / Math.expm1(4 * step);
        double residual = Math.abs(a2 - a1 + a1 * a1) * NEPER_TO_DB;
        double margin = Math.max(0.0, 0.25 * Math.log(residual / half));
        double endShift = 0.5 * Math.log(1.0 - 2.0 * a1);
        double uLo = Math.log(coveredLoHz);
        double uHi = Math.log(coveredHiHz);
        double needed = uHi - uLo + 2 * margin;
        int n = (int) Math.ceil((needed - delta) / step) + 1;
        double span = (n - 1) * step + delta;
        double c0 = 0.5 * (uLo + uHi) - 0.5 * span;
        List<Double> leading = alpha < 0 ? polesHz : zerosHz;
        List<Double> trailing = alpha < 0 ? zerosHz : polesHz;
        for (int i = 0; i < n; i++) {
            double first = c0 + i * step;
            double second = first + delta;
            if (i == 0) {
                first += endShift;
            }
            if (i == n - 1) {
                second -= endShift;
            }
            leading.add(Math.exp(first));
            trailing.add(Math.exp(second));
        }
    }

    private static Zpk normalised(List<Double> polesHz, List<Double> zerosHz) {
        List<Complex> poles = new ArrayList<>();
        List<Complex> zeros = new ArrayList<>();
        for (double p : polesHz) {
            poles.add(Complex.real(-TWO_PI * p));
        }
        for (double z : zerosHz) {
            zeros.add(Complex.real(-TWO_PI * z));
        }
        // |H| at the reference as a sum of logs: a long ladder's products could overflow
        Complex s = new Complex(0, TWO_PI * REFERENCE_HZ);
        double logMagnitude = 0;
        for (Complex z : zeros) {
            logMagnitude += Math.log(s.minus(z).abs());
        }
        for (Complex p : poles) {
            logMagnitude -= Math.log(s.minus(p).abs());
        }
        return new Zpk(zeros, poles, Math.exp(-logMagnitude));
    }

    private static double asinh(double x) {
        return Math.log(x + Math.sqrt(x * x + 1.0));
    }
}
