package org.roseate.sweep;

/**
 * An exponential (logarithmic) sine sweep: x(t) = A·sin(2π·f₁·L·(e^{t/L} − 1)) for 0 ≤ t &lt; T,
 * with L = T / ln(f₂/f₁), so the instantaneous frequency f₁·e^{t/L} runs from f₁ to f₂ (Farina
 * 2000, eq. 2). The start and end are shaped by half-Hann fades so the sweep starts and stops
 * without a click.
 *
 * <p>The k-th harmonic of the response is a copy of the sweep advanced by Δt_k = L·ln k
 * (= T·ln k / ln(f₂/f₁)), so after deconvolution its impulse response sits Δt_k before the linear
 * one ({@link #harmonicAdvanceSeconds(int)}).
 *
 * @param startHz         f₁, &gt; 0
 * @param endHz           f₂, &gt; f₁ and below the Nyquist frequency
 * @param durationSeconds T, 0.1 to 600 s
 * @param fadeSeconds     length of each half-Hann fade, ≥ 0 and at most a quarter of T
 * @param sampleRateHz    sample rate, 8 kHz to 384 kHz
 */
public record SweepSpec(double startHz, double endHz, double durationSeconds, double fadeSeconds, double sampleRateHz) {
    /** Validates the ranges; messages quote the bad value. */
    public SweepSpec {
        if (!(sampleRateHz >= 8000 && sampleRateHz <= 384000)) {
            throw new IllegalArgumentException("sample rate " + sampleRateHz + " Hz: expected 8000 to 384000 Hz");
        }
        if (!(startHz > 0)) {
            throw new IllegalArgumentException("start frequency " + startHz + " Hz: must be > 0");
        }
        if (!(endHz > startHz * 1.5)) {
            throw new IllegalArgumentException("end frequency " + endHz + " Hz: must be above 1.5 × the start frequency ("
                    + startHz + " Hz)");
        }
        if (!(endHz < sampleRateHz / 2)) {
            throw new IllegalArgumentException("end frequency " + endHz + " Hz: must be below half the sample rate ("
                    + sampleRateHz / 2 + " Hz)");
        }
        if (!(durationSeconds >= 0.1 && durationSeconds <= 600)) {
            throw new IllegalArgumentException("sweep duration " + durationSeconds + " s: expected 0.1 to 600 s");
        }
        if (!(fadeSeconds >= 0 && fadeSeconds <= durationSeconds / 4)) {
            throw new IllegalArgumentException("fade " + fadeSeconds + " s: expected 0 to a quarter of the duration ("
                    + durationSeconds / 4 + " s)");
        }
    }

    /** L = T / ln(f₂/f₁), seconds: the time the instantaneous frequency takes to grow by e. */
    public double rateConstantSeconds() {
        return durationSeconds / Math.log(endHz / startHz);
    }

    /** Δt_k = L·ln k, seconds, for harmonic order k ≥ 1 (Farina 2000). */
    public double harmonicAdvanceSeconds(int order) {
        if (order < 1) {
            throw new IllegalArgumentException("harmonic order " + order + " must be >= 1");
        }
        return rateConstantSeconds() * Math.log(order);
    }

    /** Number of samples, round(T·fs). */
    public int lengthFrames() {
        return (int) Math.round(durationSeconds * sampleRateHz);
    }

    /**
     * The frequencies the fades leave at full amplitude: f₁·e^{τ/L} to f₂·e^{−τ/L}, τ the fade, Hz.
     * Harmonic levels depend on the amplitude, so they are only given for fundamentals in this range.
     */
    public double fullLevelLowHz() {
        return startHz * Math.exp(fadeSeconds / rateConstantSeconds());
    }

    /** Upper end of {@link #fullLevelLowHz()}'s range, Hz. */
    public double fullLevelHighHz() {
        return endHz * Math.exp(-fadeSeconds / rateConstantSeconds());
    }

    /** The sweep's sample at frame n (0 ≤ n &lt; {@link #lengthFrames()}), peak amplitude 1, fades applied. */
    public double sample(long n) {
        double t = n / sampleRateHz;
        double l = rateConstantSeconds();
        double phase = 2 * Math.PI * startHz * l * Math.expm1(t / l);
        return Math.sin(phase) * fade(n);
    }

    /** The fade envelope at frame n: half-Hann rises and falls of {@link #fadeSeconds}, 1 between. */
    public double fade(long n) {
        long len = lengthFrames();
        double fadeFrames = fadeSeconds * sampleRateHz;
        if (n < 0 || n >= len) {
            return 0.0;
        }
        double fromEdge = Math.min(n, len - 1 - n);
        if (fadeFrames <= 0 || fromEdge >= fadeFrames) {
            return 1.0;
        }
        return 0.5 * (1 - Math.cos(Math.PI * fromEdge / fadeFrames));
    }

    /** The whole sweep, peak amplitude {@code peak} (full scale 1.0). */
    public double[] render(double peak) {
        double[] x = new double[lengthFrames()];
        for (int n = 0; n < x.length; n++) {
            x[n] = peak * sample(n);
        }
        return x;
    }
}
