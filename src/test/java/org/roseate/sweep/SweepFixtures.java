package org.roseate.sweep;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;

/**
 * The known filter of reference/sweep/filter.json (src/test/python/gen_sweep_reference.py:
 * scipy.signal.butter sections and their scipy.signal.sosfreqz response), and the test's own
 * direct-form-II-transposed loop to run it, independent of the project's digital package.
 */
public final class SweepFixtures {
    private static JsonNode cached;

    private SweepFixtures() {
    }

    public static synchronized JsonNode filter() {
        if (cached == null) {
            try (InputStream in = SweepFixtures.class.getResourceAsStream("/reference/sweep/filter.json")) {
                if (in == null) {
                    throw new IllegalStateException("missing test resource /reference/sweep/filter.json");
                }
                cached = new ObjectMapper().readTree(in);
            } catch (IOException e) {
                throw new UncheckedIOException(e);
            }
        }
        return cached;
    }

    /** The stored sections through a DF2T loop per section (b0 b1 b2 a0 a1 a2, a0 = 1). */
    public static double[] filter(double[] x) {
        double[] y = x.clone();
        for (JsonNode row : filter().get("sos")) {
            double b0 = row.get(0).asDouble();
            double b1 = row.get(1).asDouble();
            double b2 = row.get(2).asDouble();
            double a1 = row.get(4).asDouble();
            double a2 = row.get(5).asDouble();
            double z1 = 0;
            double z2 = 0;
            for (int n = 0; n < y.length; n++) {
                double in = y[n];
                double out = b0 * in + z1;
                z1 = b1 * in - a1 * out + z2;
                z2 = b2 * in - a2 * out;
                y[n] = out;
            }
        }
        return y;
    }

    /** Stored reference value at the grid frequency nearest hz (the grids are the same 1 kHz·2^(i/24)). */
    public static double stored(String key, double hz) {
        JsonNode f = filter();
        JsonNode hzs = f.get("hz");
        int best = 0;
        for (int i = 1; i < hzs.size(); i++) {
            if (Math.abs(Math.log(hzs.get(i).asDouble() / hz)) < Math.abs(Math.log(hzs.get(best).asDouble() / hz))) {
                best = i;
            }
        }
        if (Math.abs(hzs.get(best).asDouble() / hz - 1) > 1e-9) {
            throw new IllegalArgumentException("no stored frequency at " + hz + " Hz");
        }
        return f.get(key).get(best).asDouble();
    }

    /** x delayed by d frames and padded to length n. */
    public static double[] delayed(double[] x, int d, int n) {
        double[] out = new double[n];
        System.arraycopy(x, 0, out, d, Math.min(x.length, n - d));
        return out;
    }
}
