package org.roseate.model;

import java.util.List;

/**
 * An analog transfer function in zero-pole-gain form, in the convention of scipy.signal:
 * H(s) = gain · ∏(s − zeros[i]) / ∏(s − poles[j]), with s in rad/s.
 *
 * <p>Complex roots come in conjugate pairs (both members listed). {@code gain} is real and may be
 * negative (an inverting stage). Immutable.
 */
public record Zpk(List<Complex> zeros, List<Complex> poles, double gain) {
    public Zpk {
        zeros = List.copyOf(zeros);
        poles = List.copyOf(poles);
    }

    /** H(s) at one complex frequency s (rad/s). */
    public Complex evaluate(Complex s) {
        Complex h = Complex.real(gain);
        for (Complex z : zeros) {
            h = h.times(s.minus(z));
        }
        for (Complex p : poles) {
            h = h.dividedBy(s.minus(p));
        }
        return h;
    }

    /** H(j·2π·hz). */
    public Complex evaluateAtHz(double hz) {
        return evaluate(new Complex(0, 2 * Math.PI * hz));
    }

    /** The cascade of this and another: zeros and poles concatenated, gains multiplied. */
    public Zpk cascade(Zpk other) {
        List<Complex> z = new java.util.ArrayList<>(zeros);
        z.addAll(other.zeros);
        List<Complex> p = new java.util.ArrayList<>(poles);
        p.addAll(other.poles);
        return new Zpk(z, p, gain * other.gain);
    }
}
