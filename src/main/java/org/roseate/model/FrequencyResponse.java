package org.roseate.model;

/**
 * A complex response sampled at frequencies {@code hz} (Hz). Arrays are owned by the record;
 * callers must not modify them.
 */
public record FrequencyResponse(double[] hz, double[] re, double[] im) {
    public int size() {
        return hz.length;
    }

    /** 20·log10|H| at point i, in dB. */
    public double db(int i) {
        return 10 * Math.log10(re[i] * re[i] + im[i] * im[i]);
    }

    /** arg H at point i in degrees, in (−180, 180]. */
    public double deg(int i) {
        return Math.toDegrees(Math.atan2(im[i], re[i]));
    }

    public double[] db() {
        double[] d = new double[hz.length];
        for (int i = 0; i < d.length; i++) {
            d[i] = db(i);
        }
        return d;
    }
}
