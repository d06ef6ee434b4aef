package org.roseate.spectrum;

/**
 * A measured transfer function per FFT bin: the H1 estimate H = Gxy/Gxx (Bendat and Piersol,
 * Random Data, 4th ed., sec. 9.1, from memory), which is unbiased by noise on the response
 * channel, with the magnitude-squared coherence γ² = |Gxy|²/(Gxx·Gyy). Immutable; arrays copied.
 *
 * @param sampleRateHz      fs of the capture, Hz
 * @param segmentLength     FFT length n
 * @param frequenciesHz     bin frequencies k·fs/n, Hz
 * @param re                real part of H per bin (NaN where Gxx = 0, e.g. at DC after detrending)
 * @param im                imaginary part of H per bin
 * @param coherence         γ² per bin, in [0, 1] or NaN
 * @param averages          segments averaged
 * @param effectiveAverages 1/Σa_s²
 */
public record TransferEstimate(double sampleRateHz, int segmentLength, double[] frequenciesHz, double[] re,
        double[] im, double[] coherence, long averages, double effectiveAverages) {
    public TransferEstimate {
        frequenciesHz = frequenciesHz.clone();
        re = re.clone();
        im = im.clone();
        coherence = coherence.clone();
        int b = segmentLength / 2 + 1;
        if (frequenciesHz.length != b || re.length != b || im.length != b || coherence.length != b) {
            throw new IllegalArgumentException("every array must have " + b + " bins for segmentLength="
                    + segmentLength);
        }
    }

    /** One interpolated point of the estimate. */
    public record Point(double hz, double re, double im, double coherence) {
        /** 20·log10|H|, dB. */
        public double db() {
            return 10 * Math.log10(re * re + im * im);
        }

        /** arg H in degrees, (−180, 180]. */
        public double deg() {
            return Math.toDegrees(Math.atan2(im, re));
        }
    }

    @Override
    public double[] frequenciesHz() {
        return frequenciesHz.clone();
    }

    @Override
    public double[] re() {
        return re.clone();
    }

    @Override
    public double[] im() {
        return im.clone();
    }

    @Override
    public double[] coherence() {
        return coherence.clone();
    }

    /** Number of bins. */
    public int size() {
        return re.length;
    }

    /** Bin spacing fs/n, Hz. */
    public double binWidthHz() {
        return sampleRateHz / segmentLength;
    }

    /** |H|² of bin k. */
    public double magnitudeSquared(int k) {
        return re[k] * re[k] + im[k] * im[k];
    }

    /** 20·log10|H| of bin k, dB. */
    public double magnitudeDb(int k) {
        return 10 * Math.log10(magnitudeSquared(k));
    }

    /** arg H of bin k, degrees. */
    public double phaseDeg(int k) {
        return Math.toDegrees(Math.atan2(im[k], re[k]));
    }

    /** |H|² per bin, a fresh array (for band integration). */
    public double[] magnitudeSquared() {
        double[] m = new double[re.length];
        for (int k = 0; k < m.length; k++) {
            m[k] = magnitudeSquared(k);
        }
        return m;
    }

    /**
     * H and γ² at {@code hz}, linearly interpolated in frequency between the two nearest bins (on
     * the real and imaginary parts, so the phase needs no unwrapping).
     *
     * @param hz within [fs/n, fs/2], the first bin above DC to the Nyquist bin
     * @throws IllegalArgumentException outside that interval
     */
    public Point at(double hz) {
        double df = binWidthHz();
        if (!(hz >= df * (1 - 1e-12)) || !(hz <= frequenciesHz[re.length - 1] * (1 + 1e-12))) {
            throw new IllegalArgumentException("hz=" + hz + " is outside the resolved range " + df + " … "
                    + frequenciesHz[re.length - 1] + " Hz");
        }
        double pos = Math.min(Math.max(hz / df, 1), re.length - 1);
        int k = Math.min((int) Math.floor(pos), re.length - 2);
        double t = pos - k;
        return new Point(hz, lerp(re, k, t), lerp(im, k, t), lerp(coherence, k, t));
    }

    private static double lerp(double[] a, int k, double t) {
        return t == 0 ? a[k] : a[k] + t * (a[k + 1] - a[k]);
    }

    /**
     * This estimate divided bin by bin by a complex response sampled on another grid (a
     * calibration), interpolated with {@link #at}-style linear interpolation and held constant
     * beyond its ends. Coherence is kept.
     *
     * @param calHz ascending frequencies, Hz, at least two
     */
    TransferEstimate dividedBy(double[] calHz, double[] calRe, double[] calIm) {
        double[] r = new double[re.length];
        double[] i = new double[re.length];
        int j = 0;
        for (int k = 0; k < re.length; k++) {
            double f = frequenciesHz[k];
            double cr;
            double ci;
            if (f <= calHz[0]) {
                cr = calRe[0];
                ci = calIm[0];
            } else if (f >= calHz[calHz.length - 1]) {
                cr = calRe[calHz.length - 1];
                ci = calIm[calHz.length - 1];
            } else {
                while (calHz[j + 1] < f) {
                    j++;
                }
                double t = (f - calHz[j]) / (calHz[j + 1] - calHz[j]);
                cr = calRe[j] + t * (calRe[j + 1] - calRe[j]);
                ci = calIm[j] + t * (calIm[j + 1] - calIm[j]);
            }
            double d = cr * cr + ci * ci;
            r[k] = (re[k] * cr + im[k] * ci) / d;
            i[k] = (im[k] * cr - re[k] * ci) / d;
        }
        return new TransferEstimate(sampleRateHz, segmentLength, frequenciesHz, r, i, coherence, averages,
                effectiveAverages);
    }
}
