package org.roseate.model;

/**
 * A pole or zero of an analog transfer function, s in rad/s. For reporting: {@link #hz()} is its
 * natural frequency |s|/(2π); {@link #q()} is |s|/(−2·Re s) for a complex pair (negative for a
 * right-half-plane pair) and NaN for a real root, which has no Q.
 */
public record Root(Complex s) {
    public double hz() {
        return s.abs() / (2 * Math.PI);
    }

    public boolean isReal() {
        return s.im() == 0;
    }

    public double q() {
        return isReal() ? Double.NaN : s.abs() / (-2 * s.re());
    }
}
