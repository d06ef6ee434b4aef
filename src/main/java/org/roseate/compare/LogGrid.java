package org.roseate.compare;

/** Log-spaced frequency grids. */
public final class LogGrid {
    private LogGrid() {
    }

    /**
     * Points from loHz to hiHz inclusive, equally spaced in log f, with at least
     * {@code pointsPerDecade} points per decade (the count is rounded up to fit the ends exactly).
     */
    public static double[] points(double loHz, double hiHz, int pointsPerDecade) {
        if (!(loHz > 0) || !(hiHz > loHz) || pointsPerDecade < 1) {
            throw new IllegalArgumentException("grid " + loHz + "-" + hiHz + " Hz at " + pointsPerDecade + "/decade is invalid");
        }
        double decades = Math.log10(hiHz / loHz);
        int n = Math.max(2, (int) Math.ceil(decades * pointsPerDecade) + 1);
        double[] f = new double[n];
        double step = Math.log(hiHz / loHz) / (n - 1);
        for (int i = 0; i < n; i++) {
            f[i] = loHz * Math.exp(step * i);
        }
        f[n - 1] = hiHz;
        return f;
    }
}
