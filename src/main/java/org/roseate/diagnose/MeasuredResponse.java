package org.roseate.diagnose;

/**
 * A measured magnitude response ready for diagnosis, independent of how it was measured: one
 * entry per analysis point. Immutable; arrays are copied in and out.
 *
 * @param sampleRateHz  fs of the capture, Hz (only reported)
 * @param hz            point frequencies, Hz, ascending, each finite and &gt; 0
 * @param measuredDb    measured level per point, dB: 20·log10|H| for a transfer capture, or
 *                      10·log10 of the power density for a noise-source capture (any reference)
 * @param uncertaintyDb standard uncertainty (one standard deviation) of each measured level, dB,
 *                      finite and &gt; 0
 * @param trusted       whether each point may enter the fit (for transfer captures: coherence at or
 *                      above the threshold); untrusted points are shown but never fitted
 * @param levelFree     true when the overall level is unknown (a noise source of unknown level):
 *                      the fit then adds a free offset in dB to the model
 * @param description   one line saying what was measured, for reports
 */
public record MeasuredResponse(double sampleRateHz, double[] hz, double[] measuredDb, double[] uncertaintyDb,
        boolean[] trusted, boolean levelFree, String description) {
    /** @throws IllegalArgumentException on mismatched lengths, bad frequencies or uncertainties */
    public MeasuredResponse {
        hz = hz.clone();
        measuredDb = measuredDb.clone();
        uncertaintyDb = uncertaintyDb.clone();
        trusted = trusted.clone();
        int n = hz.length;
        if (measuredDb.length != n || uncertaintyDb.length != n || trusted.length != n) {
            throw new IllegalArgumentException("hz, measuredDb, uncertaintyDb and trusted must have the same length");
        }
        for (int i = 0; i < n; i++) {
            if (!(hz[i] > 0) || !Double.isFinite(hz[i]) || i > 0 && !(hz[i] > hz[i - 1])) {
                throw new IllegalArgumentException("hz must be finite, > 0 and ascending; hz[" + i + "]=" + hz[i]);
            }
            if (trusted[i] && (!Double.isFinite(measuredDb[i]) || !(uncertaintyDb[i] > 0)
                    || !Double.isFinite(uncertaintyDb[i]))) {
                throw new IllegalArgumentException("trusted point " + i + " needs a finite level and an uncertainty > 0");
            }
        }
    }

    @Override
    public double[] hz() {
        return hz.clone();
    }

    @Override
    public double[] measuredDb() {
        return measuredDb.clone();
    }

    @Override
    public double[] uncertaintyDb() {
        return uncertaintyDb.clone();
    }

    @Override
    public boolean[] trusted() {
        return trusted.clone();
    }

    /** Number of points. */
    public int size() {
        return hz.length;
    }

    /** Number of trusted points. */
    public int trustedCount() {
        int c = 0;
        for (boolean t : trusted) {
            c += t ? 1 : 0;
        }
        return c;
    }
}
