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
 * its rail) leaves a flat top below full scale instead: the same largest magnitude, held again and
 * again. So when at least {@value #MIN_FLAT_TOP} samples sit exactly at the channel's largest
 * magnitude, and that magnitude is at least {@value #MIN_FLAT_TOP_CODES} codes (well above the
 * quantisation of a tiny signal), those samples count as flat-topped too. For Gaussian noise at 16 bits
 * or more the exact peak value practically never recurs four times (the peak lies in the tail, where
 * each code holds about one sample in the whole record); a very slow, clean waveform can hold its
 * crest (a 16-bit sine below about 20 Hz at high level), which is why the count is reported as
 * "clipped or flat-topped" (common practice in clip detectors; the thresholds are our choice).
 */
public final class SignalCheck {
    /** RMS level below which a capture is refused as "no signal", dBFS (the limit). */
    public static final double NO_SIGNAL_DBFS = -140;
    /** Least number of samples at the exact peak magnitude that makes a flat top. */
    public static final int MIN_FLAT_TOP = 4;
    /** Least peak magnitude, in codes, for a flat top to count. */
    public static final int MIN_FLAT_TOP_CODES = 64;
    /** The quantisation step assumed for float data, full-scale units (24-bit mantissa). */
    public static final double FLOAT_CODE_FS = 0x1p-23;

    private final int[] channels;
    private final double sampleRateHz;
    private final double highClipFs;
    private final double lowClipFs;
    private final double minFlatTopFs;
    private final long[] frames;
    private final double[] sum;
    private final double[] sumSquares;
    private final double[] peak;
    private final long[] atPeak;
    private final long[] nearFullScale;

    /**
     * @param channels     the zero-based channels to check, within the interleaved frames
     * @param sampleRateHz for the time named in a refusal, Hz
     * @param codeFs       one quantisation step in full-scale units: 2^−(bits−1) for PCM,
     *                     0 for float data (then {@link #FLOAT_CODE_FS} and the float rule apply)
     */
    public SignalCheck(int[] channels, double sampleRateHz, double codeFs) {
        this.channels = channels.clone();
        this.sampleRateHz = sampleRateHz;
        double q = codeFs > 0 ? codeFs : FLOAT_CODE_FS;
        if (codeFs > 0) {
            highClipFs = 1 - 2 * codeFs;
            lowClipFs = -1 + codeFs;
        } else {
            highClipFs = 1 - FLOAT_CODE_FS;
            lowClipFs = -1 + FLOAT_CODE_FS;
        }
        minFlatTopFs = MIN_FLAT_TOP_CODES * q;
        int n = channels.length;
        frames = new long[n];
        sum = new double[n];
        sumSquares = new double[n];
        peak = new double[n];
        atPeak = new long[n];
        nearFullScale = new long[n];
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
            long at = atPeak[c];
            long near = nearFullScale[c];
            for (int i = 0; i < frameCount; i++) {
                double x = interleaved[i * stride + ch];
                if (!Double.isFinite(x)) {
                    long bad = frames[c] + i;
                    throw new MeasureException(String.format(Locale.ROOT,
                            "%s: sample %d of channel %d (at %.6f s) is %s; a capture must hold finite numbers",
                            name, bad + 1, ch + 1, bad / sampleRateHz, Double.isNaN(x) ? "NaN" : x > 0 ? "+infinity" : "-infinity"));
                }
                s += x;
                s2 += x * x;
                double a = Math.abs(x);
                if (a > pk) {
                    pk = a;
                    at = 1;
                } else if (a == pk) {
                    at++;
                }
                if (x >= highClipFs || x <= lowClipFs) {
                    near++;
                }
            }
            sum[c] = s;
            sumSquares[c] = s2;
            peak[c] = pk;
            atPeak[c] = at;
            nearFullScale[c] = near;
            frames[c] += frameCount;
        }
    }

    /** The figures so far for each checked channel, in the order given. */
    public ChannelIntegrity[] snapshot() {
        ChannelIntegrity[] out = new ChannelIntegrity[channels.length];
        for (int c = 0; c < channels.length; c++) {
            double pk = peak[c];
            boolean flatTop = atPeak[c] >= MIN_FLAT_TOP && pk >= minFlatTopFs && pk < highClipFs && -pk > lowClipFs;
            long n = frames[c];
            double ms = n == 0 ? 0 : sumSquares[c] / n;
            out[c] = new ChannelIntegrity(channels[c], n, n == 0 ? 0 : sum[c] / n, 10 * Math.log10(2 * ms), pk,
                    nearFullScale[c] + (flatTop ? atPeak[c] : 0));
        }
        return out;
    }
}
