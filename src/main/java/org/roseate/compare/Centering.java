package org.roseate.compare;

/**
 * The one offset that makes the largest and smallest of a set of deviations equal and opposite
 * (a minimax centring): offset = −(max + min)/2, peak = (max − min)/2.
 */
record Centering(double offsetDb, double peakDb) {
    static Centering of(double[] rawDb) {
        double max = Double.NEGATIVE_INFINITY;
        double min = Double.POSITIVE_INFINITY;
        for (double d : rawDb) {
            max = Math.max(max, d);
            min = Math.min(min, d);
        }
        return new Centering(-(max + min) / 2, (max - min) / 2);
    }

    double[] apply(double[] rawDb) {
        double[] out = new double[rawDb.length];
        for (int i = 0; i < out.length; i++) {
            out[i] = rawDb[i] + offsetDb;
        }
        return out;
    }
}
