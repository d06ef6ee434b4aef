package org.roseate.model;

/**
 * An immutable complex number, used for poles, zeros and single-point evaluations.
 * Hot loops over frequency arrays work on separate {@code re[]}/{@code im[]} arrays instead.
 */
public record Complex(double re, double im) {
    public static final Complex ZERO = new Complex(0, 0);
    public static final Complex ONE = new Complex(1, 0);

    public static Complex real(double re) {
        return new Complex(re, 0);
    }

    public Complex plus(Complex o) {
        return new Complex(re + o.re, im + o.im);
    }

    public Complex minus(Complex o) {
        return new Complex(re - o.re, im - o.im);
    }

    public Complex times(Complex o) {
        return new Complex(re * o.re - im * o.im, re * o.im + im * o.re);
    }

    public Complex times(double k) {
        return new Complex(re * k, im * k);
    }

    /** Division by Smith's algorithm, which avoids needless overflow and underflow. */
    public Complex dividedBy(Complex o) {
        if (Math.abs(o.re) >= Math.abs(o.im)) {
            double r = o.im / o.re;
            double d = o.re + o.im * r;
            return new Complex((re + im * r) / d, (im - re * r) / d);
        }
        double r = o.re / o.im;
        double d = o.re * r + o.im;
        return new Complex((re * r + im) / d, (im * r - re) / d);
    }

    public Complex reciprocal() {
        return ONE.dividedBy(this);
    }

    public Complex conjugate() {
        return new Complex(re, -im);
    }

    public double abs() {
        return Math.hypot(re, im);
    }

    /** Argument in radians, in (−π, π]. */
    public double arg() {
        return Math.atan2(im, re);
    }

    public boolean isFinite() {
        return Double.isFinite(re) && Double.isFinite(im);
    }

    @Override
    public String toString() {
        return im >= 0 ? re + "+" + im + "j" : re + "-" + (-im) + "j";
    }
}
