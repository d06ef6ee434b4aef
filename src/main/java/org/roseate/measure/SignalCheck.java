package org.roseate.measure;

import java.util.Locale;

/**
 * Streaming checks on the samples of the analysed channels: the first non-finite sample, clipping,
 * DC offset, RMS and peak. One analysis thread feeds it; it allocates nothing per block.
 *
 * <p><b>Clipping.</b> A sample counts as clipped when it lies at or within one quantisation code of
 * full scale: x ≥ x_max − q or x ≤ −1 + q, with q = 2^−(bits−1) and x_max = 1 − q for PCM
 * (two's complement is one code short of +1), and |x| ≥ 1 − 2^−23 for float files (float samples
 * beyond ±1 are over full scale and count too). A clip before the converter (an op-amp running into
 * its rail) leaves a flat top below full scale instead; so samples in runs of at least
 * {@value #MIN_FLAT_RUN} identical consecutive values at the channel's own largest magnitude count
 * as well. Random noise at 16 bits or more practically never repeats a value four times at its
 * peak; a very slow, very clean waveform can (a 16-bit sine below about 20 Hz at full level holds
 * its crest for several samples), which is why these are reported as "clipped or flat-topped"
 * (common practice in clip detectors; the run length is our choice).
 */
public final class SignalCheck {
    /** RMS level below which a capture is refused as "no signal", dBFS (the limit). */
    public static final double NO_SIGNAL_DBFS = -140;
    /** Shortest run of identical samples at the peak that counts as flat-topped. */
    public static final int MIN_FLAT_RUN = 4;
    /** The quantisation step assumed for float data, full-scale units (24-bit mantissa). */
    public static final double FLOAT_CODE_FS = 0x1p-23;

    private final int[] channels;
    private final double sampleRateHz;
    private final double highClipFs;
    private final double lowClipFs;
    private final long[] frames;
    private final double[] sum;
    private final double[] sumSquares;
    private final double[] peak;
    private final long[] nearFullScale;
    private final double[] runValue;
    private final long[] runLength;
    private final double[] flatMagnitude;
    private final long[] flatCount;

    /**
     * @param channels     the zero-based channels to check, within the interleaved frames
     * @param sampleRateHz for the time named in a refusal, Hz
     * @param codeFs       one quantisation step in full-scale units: 2^−(bits−1) for PCM,
     *                     0 for float data (then {@link #FLOAT_CODE_FS} and the float rule apply)
     */
    public SignalCheck(int[] channels, double sampleRateHz, double codeFs) {
        this.channels = channels.clone();
        this.sampleRateHz = sampleRateHz;
        if (codeFs > 0) {
            highClipFs = 1 - 2 * codeFs;
            lowClipFs = -1 + codeFs;
        } else {
            highClipFs = 1 - FLOAT_CODE_FS;
            lowClipFs = -1 + FLOAT_CODE_FS;
        }
        int n = channels.length;
        frames = new long[n];
        sum = new double[n];
        sumSquares = new double[n];
        peak = new double[n];
        nearFullScale = new long[n];
        runValue = new double[n];
        runLength = new long[n];
        flatMagnitude = new double[n];
        flatCount = new long[n];
        java.util.Arrays.fill(runValue, Double.NaN);
    }

    /**
     * Checks a block of interleaved frames.
     *
     * @param name a name for the source, for the message
     * @throws MeasureException at the first NaN or infinite sample of a checked channel, naming its
     *                          time from the start of the capture and its channel
     */
    public void accept(double[] interleaved, int frameCount, int stride, String name) {
        for (int c = 0; c < channels.length; c++) {
            int ch = channels[c];
            double s = sum[c];
            double s2 = sumSquares[c];
            double pk = peak[c];
            long near = nearFullScale[c];
            double rv = runValue[c];
            long rl = runLength[c];
            for (int i = 0; i < frameCount; i++) {
                double x = interleaved[i * stride + ch];
                if (!Double.isFinite(x)) {
                    long at = frames[c] + i;
                    throw new MeasureException(String.format(Locale.ROOT,
                            "%s: sample %d of channel %d (at %.6f s) is %s; a capture must hold finite numbers",
                            name, at + 1, ch + 1, at / sampleRateHz, Double.isNaN(x) ? "NaN" : x > 0 ? "+infinity" : "-infinity"));
                }
                s += x;
                s2 += x * x;
                double a = Math.abs(x);
                if (a > pk) {
                    pk = a;
                }
                if (x >= highClipFs || x <= lowClipFs) {
                    near++;
                }
                if (x == rv) {
                    rl++;
                } else {
                    closeRun(c, rv, rl);
                    rv = x;
                    rl = 1;
                }
            }
            sum[c] = s;
            sumSquares[c] = s2;
            peak[c] = pk;
            nearFullScale[c] = near;
            runValue[c] = rv;
            runLength[c] = rl;
            frames[c] += frameCount;
        }
    }

    private void closeRun(int c, double value, long length) {
        if (length >= MIN_FLAT_RUN && value != 0) {
            double a = Math.abs(value);
            if (a > flatMagnitude[c]) {
                flatMagnitude[c] = a;
                flatCount[c] = length;
            } else if (a == flatMagnitude[c]) {
                flatCount[c] += length;
            }
        }
    }

    /** The figures so far for each checked channel, in the order given. */
    public ChannelIntegrity[] snapshot() {
        ChannelIntegrity[] out = new ChannelIntegrity[channels.length];
        for (int c = 0; c < channels.length; c++) {
            double flatMag = flatMagnitude[c];
            long flat = flatCount[c];
            double rv = runValue[c];
            long rl = runLength[c];
            if (rl >= MIN_FLAT_RUN && rv != 0) {
                double a = Math.abs(rv);
                if (a > flatMag) {
                    flatMag = a;
                    flat = rl;
                } else if (a == flatMag) {
                    flat += rl;
                }
            }
            boolean flatAtPeak = flat > 0 && flatMag == peak[c] && flatMag < highClipFs && -flatMag > lowClipFs;
            long n = frames[c];
            double ms = n == 0 ? 0 : sumSquares[c] / n;
            out[c] = new ChannelIntegrity(channels[c], n, n == 0 ? 0 : sum[c] / n, 10 * Math.log10(2 * ms), peak[c],
                    nearFullScale[c] + (flatAtPeak ? flat : 0));
        }
        return out;
    }
}
