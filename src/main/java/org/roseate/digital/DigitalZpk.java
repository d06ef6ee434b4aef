package org.roseate.digital;

import java.util.List;
import org.roseate.model.Complex;

/**
 * A digital transfer function in zero-pole-gain form: H(z) = gain · ∏(z − zeros[i]) / ∏(z − poles[j]),
 * the convention of scipy.signal.freqz_zpk. Complex roots come in conjugate pairs (both listed). Immutable.
 *
 * @param zeros        z-plane zeros
 * @param poles        z-plane poles
 * @param gain         real gain
 * @param sampleRateHz sample rate in Hz the roots refer to, finite and &gt; 0
 */
public record DigitalZpk(List<Complex> zeros, List<Complex> poles, double gain, double sampleRateHz) {
    public DigitalZpk {
        zeros = List.copyOf(zeros);
        poles = List.copyOf(poles);
        if (!(sampleRateHz > 0) || !Double.isFinite(sampleRateHz)) {
            throw new IllegalArgumentException("sampleRateHz=" + sampleRateHz + " must be finite and > 0");
        }
        if (!Double.isFinite(gain)) {
            throw new IllegalArgumentException("gain=" + gain + " must be finite");
        }
        for (Complex r : zeros) {
            if (!r.isFinite()) {
                throw new IllegalArgumentException("zero " + r + " must be finite");
            }
        }
        for (Complex r : poles) {
            if (!r.isFinite()) {
                throw new IllegalArgumentException("pole " + r + " must be finite");
            }
        }
    }

    /** H(z) at one point of the z-plane. */
    public Complex evaluate(Complex z) {
        Complex h = Complex.real(gain);
        for (Complex q : zeros) {
            h = h.times(z.minus(q));
        }
        for (Complex p : poles) {
            h = h.dividedBy(z.minus(p));
        }
        return h;
    }

    /** H(e^{j2π·hz/fs}), hz in Hz (any finite value; the response repeats every fs). */
    public Complex response(double hz) {
        double w = 2 * Math.PI * hz / sampleRateHz;
        return evaluate(new Complex(Math.cos(w), Math.sin(w)));
    }
}
