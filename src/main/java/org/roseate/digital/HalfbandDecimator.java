package org.roseate.digital;

import org.roseate.model.Complex;

/**
 * A linear-phase FIR half-band low-pass followed by taking every second sample (decimation by 2).
 *
 * <p>Taps: h[n] = ½·sinc((n − 2K)/2)·w(n) for n = 0..4K, with w the Kaiser window of length 4K + 1 and
 * shape β; the taps at even distance from the centre (other than the centre, ½) are exactly zero, and so
 * are both end taps, which keeps the delay an integer at the output rate. The odd taps are scaled to sum to
 * ½, so the DC gain is exactly 1 and H(f) + H(fs/2 − f) = 1 holds for the zero-phase amplitude.
 * Source: Kaiser window design and its β and length formulas, Oppenheim &amp; Schafer, Discrete-Time
 * Signal Processing, section on the Kaiser window method (common practice).
 *
 * <p>Group delay: 2K samples at the input rate, K samples at the output rate (exact, linear phase).
 * Immutable; {@link #newRuntime()} gives the streaming state.
 */
public final class HalfbandDecimator {
    private final double inputRateHz;
    private final int halfLength;
    private final double beta;
    private final double[] taps;
    /** Non-zero off-centre taps h[1], h[3], .., h[2K−1] (the other half mirrors them). */
    private final double[] oddTaps;
    private final double centreTap;

    private HalfbandDecimator(double inputRateHz, int halfLength, double beta) {
        this.inputRateHz = inputRateHz;
        this.halfLength = halfLength;
        this.beta = beta;
        int len = 4 * halfLength + 1;
        int c = 2 * halfLength;
        double[] h = new double[len];
        double i0b = besselI0(beta);
        double oddSum = 0;
        for (int n = 0; n < len; n++) {
            int m = n - c;
            if (m % 2 != 0) {
                double r = (double) m / c;
                double w = besselI0(beta * Math.sqrt(1 - r * r)) / i0b;
                double x = Math.PI * m / 2;
                h[n] = 0.5 * Math.sin(x) / x * w;
                oddSum += h[n];
            }
        }
        for (int n = 0; n < len; n++) {
            h[n] *= 0.5 / oddSum;
        }
        h[c] = 0.5;
        taps = h;
        centreTap = 0.5;
        oddTaps = new double[halfLength];
        for (int j = 0; j < halfLength; j++) {
            oddTaps[j] = h[2 * j + 1];
        }
    }

    /**
     * The half-band with explicit Kaiser parameters.
     *
     * @param inputRateHz input sample rate in Hz, finite and &gt; 0
     * @param halfLength  K ≥ 1: 4K + 1 taps, 2K of them non-zero off the centre
     * @param beta        Kaiser shape β ≥ 0
     */
    public static HalfbandDecimator kaiser(double inputRateHz, int halfLength, double beta) {
        if (!(inputRateHz > 0) || !Double.isFinite(inputRateHz)) {
            throw new IllegalArgumentException("inputRateHz=" + inputRateHz + " must be finite and > 0");
        }
        if (halfLength < 1 || halfLength > 10_000) {
            throw new IllegalArgumentException("halfLength=" + halfLength + " must be in [1, 10000]");
        }
        if (!(beta >= 0) || !Double.isFinite(beta)) {
            throw new IllegalArgumentException("beta=" + beta + " must be finite and >= 0");
        }
        return new HalfbandDecimator(inputRateHz, halfLength, beta);
    }

    /**
     * The shortest Kaiser half-band meeting a specification, checked on its own response: the stopband
     * [fs/2 − passbandEdgeHz, fs/2] (fs = input rate) is at least {@code rejectionDb} down and the passband
     * [0, passbandEdgeHz] deviates from 0 dB by at most {@code maxRippleDb}. β = 0.1102·(A − 8.7) and the
     * starting length N = (A − 8)/(2.285·Δω) + 1 are Kaiser's formulas (O&amp;S, Kaiser window method);
     * K then grows until the measured response meets the specification.
     *
     * @param inputRateHz    input rate in Hz, finite and &gt; 0
     * @param passbandEdgeHz passband edge in Hz, 0 &lt; edge &lt; inputRateHz/4
     * @param rejectionDb    stopband rejection A in dB, 50 ≤ A ≤ 200
     * @param maxRippleDb    allowed passband deviation in dB, &gt; 0
     */
    public static HalfbandDecimator design(double inputRateHz, double passbandEdgeHz, double rejectionDb,
            double maxRippleDb) {
        if (!(inputRateHz > 0) || !Double.isFinite(inputRateHz)) {
            throw new IllegalArgumentException("inputRateHz=" + inputRateHz + " must be finite and > 0");
        }
        if (!(passbandEdgeHz > 0) || !(passbandEdgeHz < inputRateHz / 4)) {
            throw new IllegalArgumentException("passbandEdgeHz=" + passbandEdgeHz + " must be in (0, "
                    + inputRateHz / 4 + ") Hz for input rate " + inputRateHz + " Hz");
        }
        if (!(rejectionDb >= 50) || !(rejectionDb <= 200)) {
            throw new IllegalArgumentException("rejectionDb=" + rejectionDb + " must be in [50, 200]");
        }
        if (!(maxRippleDb > 0) || !Double.isFinite(maxRippleDb)) {
            throw new IllegalArgumentException("maxRippleDb=" + maxRippleDb + " must be finite and > 0");
        }
        double beta = 0.1102 * (rejectionDb - 8.7);
        double deltaOmega = 2 * Math.PI * (inputRateHz / 2 - 2 * passbandEdgeHz) / inputRateHz;
        double n = (rejectionDb - 8) / (2.285 * deltaOmega) + 1;
        int k = Math.max(1, (int) Math.ceil((n - 1) / 4));
        while (true) {
            HalfbandDecimator d = new HalfbandDecimator(inputRateHz, k, beta);
            // half a dB margin on the grid: the true extremum may fall between grid points
            if (d.measuredRejectionDb(passbandEdgeHz) >= rejectionDb + 0.5
                    && d.measuredRippleDb(passbandEdgeHz) <= maxRippleDb) {
                return d;
            }
            k++;
            if (k > 10_000) {
                throw new IllegalStateException("no half-band up to K=10000 meets the specification");
            }
        }
    }

    /** Input rate in Hz. */
    public double inputRateHz() {
        return inputRateHz;
    }

    /** Output rate in Hz (input rate / 2). */
    public double outputRateHz() {
        return inputRateHz / 2;
    }

    /** K: the filter has 4K + 1 taps. */
    public int halfLength() {
        return halfLength;
    }

    /** Kaiser shape β. */
    public double beta() {
        return beta;
    }

    /** A copy of the 4K + 1 taps (h[0] and h[4K] are zero). */
    public double[] taps() {
        return taps.clone();
    }

    /** Group delay, exact: 2K samples at the input rate. */
    public int groupDelayInputSamples() {
        return 2 * halfLength;
    }

    /** Group delay, exact: K samples at the output rate. */
    public int groupDelayOutputSamples() {
        return halfLength;
    }

    /**
     * H(e^{j2π·hz/fs}) = Σ h[n]·e^{−jωn} at the input rate fs, including the linear phase of the 2K-sample delay.
     *
     * @param hz frequency in Hz, any finite value
     */
    public Complex response(double hz) {
        double w = 2 * Math.PI * hz / inputRateHz;
        double amp = amplitude(w);
        double phase = -w * 2 * halfLength;
        return new Complex(amp * Math.cos(phase), amp * Math.sin(phase));
    }

    /** Zero-phase amplitude: h_c + 2·Σ h[c − m]·cos(mω) over the odd offsets m. */
    private double amplitude(double w) {
        double a = centreTap;
        for (int j = 0; j < halfLength; j++) {
            int m = 2 * halfLength - (2 * j + 1);
            a += 2 * oddTaps[j] * Math.cos(m * w);
        }
        return a;
    }

    private double gridStepHz() {
        return inputRateHz / (16.0 * (4 * halfLength + 1));
    }

    double measuredRejectionDb(double passbandEdgeHz) {
        double lo = inputRateHz / 2 - passbandEdgeHz;
        double hi = inputRateHz / 2;
        int pts = (int) Math.ceil((hi - lo) / gridStepHz()) + 1;
        double peak = 0;
        for (int i = 0; i < pts; i++) {
            double f = lo + (hi - lo) * i / (pts - 1);
            peak = Math.max(peak, Math.abs(amplitude(2 * Math.PI * f / inputRateHz)));
        }
        return -20 * Math.log10(peak);
    }

    double measuredRippleDb(double passbandEdgeHz) {
        int pts = (int) Math.ceil(passbandEdgeHz / gridStepHz()) + 1;
        double worst = 0;
        for (int i = 0; i < pts; i++) {
            double f = passbandEdgeHz * i / (pts - 1);
            double db = 20 * Math.log10(Math.abs(amplitude(2 * Math.PI * f / inputRateHz)));
            worst = Math.max(worst, Math.abs(db));
        }
        return worst;
    }

    /** A fresh streaming state (zero history). */
    public Runtime newRuntime() {
        return new Runtime(this);
    }

    /** Modified Bessel function of the first kind, order 0, by its power series Σ ((x/2)^k / k!)². */
    static double besselI0(double x) {
        double sum = 1;
        double term = 1;
        double q = x * x / 4;
        for (int k = 1; k < 500; k++) {
            term *= q / ((double) k * k);
            sum += term;
            if (term < sum * 1e-17) {
                break;
            }
        }
        return sum;
    }

    /**
     * Streaming state: consumes any number of input samples per call and emits one output for every
     * second input, counting from construction or {@link #reset()} (output m is Σ h[n]·x[2m − n], the
     * result of scipy.signal.upfirdn(h, x, down=2)). Allocation-free; one thread at a time.
     *
     * <p>Each output is summed in one fixed order: the centre tap's product, then for j = 0..K−1 the
     * product of h[2j+1] with the pair x[i−(2j+1)] + x[i−(4K−2j−1)]. Eight outputs are summed side by side
     * (each in that order), so eight addition chains are in flight instead of one; the result is bitwise
     * that of one output at a time, for any split of the input into calls.
     */
    public static final class Runtime {
        /** Input samples handled per pass through the linear work buffer. */
        private static final int CHUNK = 1024;
        private final HalfbandDecimator design;
        /** 4K: the history an output needs before its newest input. */
        private final int span;
        /** work[0..span) holds the last span inputs before the current chunk, then the chunk itself. */
        private final double[] work;
        private boolean evenPhase = true;

        private Runtime(HalfbandDecimator design) {
            this.design = design;
            this.span = 4 * design.halfLength;
            this.work = new double[span + CHUNK];
        }

        /** The design this state runs. */
        public HalfbandDecimator design() {
            return design;
        }

        /**
         * Filters and decimates {@code in[inOffset..inOffset+nIn)}.
         *
         * @param nIn any count ≥ 0, odd or even; the phase carries over to the next call
         * @return the number of samples written to {@code out} from {@code outOffset}: (nIn + 1)/2 or nIn/2
         *         depending on the carried phase; {@code out} must have room for (nIn + 1)/2
         */
        public int process(double[] in, int inOffset, int nIn, double[] out, int outOffset) {
            if (inOffset < 0 || nIn < 0 || inOffset > in.length - nIn) {
                throw new IllegalArgumentException("inOffset=" + inOffset + ", nIn=" + nIn
                        + " outside input of length " + in.length);
            }
            int maxOut = (nIn + (evenPhase ? 1 : 0)) / 2;
            if (outOffset < 0 || outOffset > out.length - maxOut) {
                throw new IllegalArgumentException("outOffset=" + outOffset + " leaves no room for " + maxOut
                        + " samples in output of length " + out.length);
            }
            int o = outOffset;
            int done = 0;
            while (done < nIn) {
                int n = Math.min(CHUNK, nIn - done);
                System.arraycopy(in, inOffset + done, work, span, n);
                // outputs fall on the chunk's inputs 0, 2, 4, .. in even phase, 1, 3, .. otherwise
                int first = evenPhase ? 0 : 1;
                int count = first < n ? (n - first + 1) / 2 : 0;
                filter(span + first, count, out, o);
                o += count;
                evenPhase = ((n & 1) == 0) == evenPhase;
                System.arraycopy(work, n, work, 0, span);
                done += n;
            }
            return o - outOffset;
        }

        /** Outputs for the newest inputs work[q], work[q+2], .., count of them, into out[o..). */
        private void filter(int q, int count, double[] out, int o) {
            final double[] x = work;
            final double[] odd = design.oddTaps;
            final double centre = design.centreTap;
            final int k = design.halfLength;
            final int c = 2 * k;
            final int last = 4 * k;
            int m = 0;
            for (; m + 7 < count; m += 8) {
                int p0 = q + 2 * m;
                int p1 = p0 + 2;
                int p2 = p0 + 4;
                int p3 = p0 + 6;
                int p4 = p0 + 8;
                int p5 = p0 + 10;
                int p6 = p0 + 12;
                int p7 = p0 + 14;
                double acc0 = centre * x[p0 - c];
                double acc1 = centre * x[p1 - c];
                double acc2 = centre * x[p2 - c];
                double acc3 = centre * x[p3 - c];
                double acc4 = centre * x[p4 - c];
                double acc5 = centre * x[p5 - c];
                double acc6 = centre * x[p6 - c];
                double acc7 = centre * x[p7 - c];
                for (int j = 0; j < k; j++) {
                    double h = odd[j];
                    int near = 2 * j + 1;
                    int far = last - 2 * j - 1;
                    acc0 += h * (x[p0 - near] + x[p0 - far]);
                    acc1 += h * (x[p1 - near] + x[p1 - far]);
                    acc2 += h * (x[p2 - near] + x[p2 - far]);
                    acc3 += h * (x[p3 - near] + x[p3 - far]);
                    acc4 += h * (x[p4 - near] + x[p4 - far]);
                    acc5 += h * (x[p5 - near] + x[p5 - far]);
                    acc6 += h * (x[p6 - near] + x[p6 - far]);
                    acc7 += h * (x[p7 - near] + x[p7 - far]);
                }
                out[o + m + 0] = acc0;
                out[o + m + 1] = acc1;
                out[o + m + 2] = acc2;
                out[o + m + 3] = acc3;
                out[o + m + 4] = acc4;
                out[o + m + 5] = acc5;
                out[o + m + 6] = acc6;
                out[o + m + 7] = acc7;
            }
            for (; m < count; m++) {
                int p = q + 2 * m;
                double acc = centre * x[p - c];
                for (int j = 0; j < k; j++) {
                    acc += odd[j] * (x[p - (2 * j + 1)] + x[p - (last - 2 * j - 1)]);
                }
                out[o + m] = acc;
            }
        }

        /** Clears the history and the phase. */
        public void reset() {
            java.util.Arrays.fill(work, 0);
            evenPhase = true;
        }
    }
}
