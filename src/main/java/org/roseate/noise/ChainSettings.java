package org.roseate.noise;

/**
 * How a noise chain renders.
 *
 * @param sampleRateHz      output rate in Hz, 100 to 384000 (control rates down to 100 Hz)
 * @param channels          1 to 8
 * @param identicalChannels true: every channel carries the same noise; false: independent noise
 *                          per channel (each from its own split of the generator)
 * @param seed              generator seed; the same settings and seed give the same samples
 * @param levelDbfs         RMS level of the output in dBFS (AES17: a full-scale sine reads 0 dBFS),
 *                          −200 to +20
 * @param distribution      Gaussian (default) or uniform white noise at the chain's input
 * @param softLimiter       apply {@link SoftLimiter} (knee −1 dBFS) to the output; off by default
 */
public record ChainSettings(double sampleRateHz, int channels, boolean identicalChannels, long seed,
        double levelDbfs, WhiteNoiseSource.Distribution distribution, boolean softLimiter) {

    public ChainSettings {
        if (!(sampleRateHz >= 100) || !(sampleRateHz <= 384000)) {
            throw new IllegalArgumentException("sampleRateHz=" + sampleRateHz + " must be within 100..384000");
        }
        if (channels < 1 || channels > 8) {
            throw new IllegalArgumentException("channels=" + channels + " must be within 1..8");
        }
        if (!(levelDbfs >= -200) || !(levelDbfs <= 20)) {
            throw new IllegalArgumentException("levelDbfs=" + levelDbfs + " must be within -200..+20");
        }
        if (distribution == null) {
            throw new IllegalArgumentException("distribution must not be null");
        }
    }

    /** Gaussian noise, no limiter. */
    public ChainSettings(double sampleRateHz, int channels, boolean identicalChannels, long seed, double levelDbfs) {
        this(sampleRateHz, channels, identicalChannels, seed, levelDbfs, WhiteNoiseSource.Distribution.GAUSSIAN, false);
    }

    public ChainSettings withLevel(double newLevelDbfs) {
        return new ChainSettings(sampleRateHz, channels, identicalChannels, seed, newLevelDbfs, distribution, softLimiter);
    }

    public ChainSettings withSeed(long newSeed) {
        return new ChainSettings(sampleRateHz, channels, identicalChannels, newSeed, levelDbfs, distribution, softLimiter);
    }

    public ChainSettings withDistribution(WhiteNoiseSource.Distribution d) {
        return new ChainSettings(sampleRateHz, channels, identicalChannels, seed, levelDbfs, d, softLimiter);
    }

    public ChainSettings withSoftLimiter(boolean on) {
        return new ChainSettings(sampleRateHz, channels, identicalChannels, seed, levelDbfs, distribution, on);
    }
}
