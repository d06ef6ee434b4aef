package org.roseate.measure;

/**
 * What one analysed channel's samples say about the capture itself, before any spectrum.
 *
 * @param channel        zero-based channel
 * @param frames         samples read from it
 * @param dcOffsetFs     the mean, in full-scale units (−1 … 1)
 * @param rmsDbfs        the overall RMS level, DC included, 20·log10(√2·rms) dBFS (AES17: a
 *                       full-scale sine reads 0 dBFS); −∞ for all-zero input
 * @param peakFs         the largest |sample|, full-scale units
 * @param clippedSamples samples at or within one code of full scale, plus samples held at
 *                       the channel's own peak (see {@link SignalCheck})
 */
public record ChannelIntegrity(int channel, long frames, double dcOffsetFs, double rmsDbfs, double peakFs,
        long clippedSamples) {
    /** True when any sample counts as clipped. */
    public boolean clipped() {
        return clippedSamples > 0;
    }

    /** True when the RMS level is below {@link SignalCheck#NO_SIGNAL_DBFS} (or the channel is all zero). */
    public boolean noSignal() {
        return !(rmsDbfs >= SignalCheck.NO_SIGNAL_DBFS);
    }
}
