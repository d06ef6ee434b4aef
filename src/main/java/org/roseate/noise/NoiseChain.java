package org.roseate.noise;

import java.util.Optional;
import org.roseate.bands.BandFraction;
import org.roseate.bands.BandTable;
import org.roseate.model.BandPower;
import org.roseate.digital.Decimator;
import org.roseate.digital.FidelityReport;
import org.roseate.digital.OversampledFilter;
import org.roseate.digital.Oversampling;
import org.roseate.digital.PrewarpRule;
import org.roseate.digital.StationaryState;
import org.roseate.model.Zpk;

/**
 * The streaming chain from white noise to output samples: a seeded white source at M·fs, the
 * design's bilinear sections at M·fs, the half-band decimator to fs, a gain that sets the RMS level,
 * and an optional soft limiter. M (1, 2, 4, 8 or 16) is chosen automatically as the smallest factor that
 * keeps every third-octave band of the output band within ±{@link #FIDELITY_TOLERANCE_DB} of the
 * analog model ({@link Oversampling#select}).
 *
 * <p>The level gain comes from the digital path's noise power, computed once from its response:
 * for unit-variance white input at M·fs the output variance is (2/(M·fs))·∫₀^{M·fs/2}
 * |H_sections(f)·H_decimator(f)|² df (decimation keeps the variance of a stationary signal), and the
 * gain is 10^(L/20)/√(2·variance) (AES17). No trial renders.
 *
 * <p><b>Steady-state start.</b> Each running filter starts in a state drawn from its stationary
 * distribution ({@link StationaryState}), so a slow circuit (a 10 s time constant) is at its long-run
 * expected level from the first sample instead of rising from rest.
 *
 * <p>The chain design is immutable; each instance holds its own running state (noise generators,
 * filter states, buffers) and serves one thread. {@link #render} allocates nothing; memory is
 * constant whatever the duration.
 */
public final class NoiseChain implements FrameSource {
    /** Fidelity target per third-octave band, dB. */
    public static final double FIDELITY_TOLERANCE_DB = 0.1;
    /** Frames per internal block. */
    private static final int BLOCK = 512;

    private final ChainSettings settings;
    private final Zpk analog;
    private final OversampledFilter filter;
    private final StationaryState stationary;
    private final FidelityReport fidelity;
    private final double noisePowerGain;
    private final double gain;
    private final String describe;

    private final WhiteNoiseSource[] sources;
    private final OversampledFilter.Runtime[] runtimes;
    private final double[] white;
    private final double[][] out;
    private final SoftLimiter limiter;

    private NoiseChain(ChainSettings s, Zpk analog, OversampledFilter filter, FidelityReport fidelity,
            double noisePowerGain, String describe) {
        this.settings = s;
        this.analog = analog;
        this.filter = filter;
        this.stationary = filter == null ? null : StationaryState.of(filter.sections());
        this.fidelity = fidelity;
        this.noisePowerGain = noisePowerGain;
        this.gain = LevelCalculator.gainForLevel(noisePowerGain, s.levelDbfs());
        this.describe = describe;
        int streams = s.identicalChannels() ? 1 : s.channels();
        sources = new WhiteNoiseSource[streams];
        WhiteNoiseSource root = new WhiteNoiseSource(s.seed(), s.distribution());
        sources[0] = root;
        for (int c = 1; c < streams; c++) {
            sources[c] = root.split();
        }
        int factor = filter == null ? 1 : filter.factor();
        runtimes = new OversampledFilter.Runtime[streams];
        for (int c = 0; c < streams; c++) {
            runtimes[c] = filter == null ? null : filter.newRuntime();
        }
        white = new double[BLOCK * factor];
        out = new double[streams][BLOCK];
        limiter = s.softLimiter() ? new SoftLimiter() : null;
        startStationary();
    }

    /** Stream index (for {@link WhiteNoiseSource#independent}) of the draws that set the starting state. */
    private static final int STATE_STREAM = 1000;

    /**
     * Puts every running filter in its steady state: the sections' state drawn from their stationary
     * covariance ({@link StationaryState}), then {@link org.roseate.digital.Decimator#historyOutputSamples()}
     * outputs run and discarded so the decimator's history is a stationary sample too. The expected
     * level is then the long-run level from the first sample. The draws come from their own seeded
     * stream, so the output stays a function of the seed alone.
     */
    private void startStationary() {
        if (filter == null) {
            return;
        }
        WhiteNoiseSource draws = new WhiteNoiseSource(settings.seed()).independent(STATE_STREAM);
        double[] state = new double[stationary.dimension()];
        int factor = filter.factor();
        int warm = filter.decimator().historyOutputSamples();
        for (int s = 0; s < runtimes.length; s++) {
            stationary.draw(draws::next, 1.0, state);
            runtimes[s].setSectionState(state);
            int done = 0;
            while (done < warm) {
                int n = Math.min(BLOCK, warm - done);
                sources[s].fill(white, 0, n * factor);
                runtimes[s].process(white, out[s], n);
                done += n;
            }
        }
    }

    /**
     * The design through its digital model.
     *
     * @param analog the design's analog transfer function (rad/s)
     * @throws org.roseate.digital.UnrenderableModelException when the model cannot be rendered
     *         (right-half-plane poles, improper, zero gain), with a one-line message
     */
    public static NoiseChain design(Zpk analog, ChainSettings s) {
        return design(analog, s, "design");
    }

    /** As {@link #design(Zpk, ChainSettings)}, with a name for {@link #describe()}. */
    public static NoiseChain design(Zpk analog, ChainSettings s, String name) {
        double gainMatchHz = gainMatchHz(fidelityBands(s.sampleRateHz()));
        FidelityReport report = fidelity(analog, s.sampleRateHz());
        OversampledFilter f = OversampledFilter.design(analog, s.sampleRateHz(), report.factor(), PrewarpRule.PER_ROOT,
                gainMatchHz);
        double g = pathNoisePower(f, analog);
        String d = name + ", " + report.factor() + "x oversampled, " + f.sections().sections().size() + " sections";
        return new NoiseChain(s, analog, f, report, g, d);
    }

    /** Unfiltered white noise at the set RMS level. */
    public static NoiseChain white(ChainSettings s) {
        return new NoiseChain(s, null, null, null, 1.0, "white noise");
    }

    /** The ideal-pink reference ({@link IdealPink#DEFAULT_PINK}) through the same digital path. */
    public static NoiseChain idealPink(ChainSettings s) {
        return design(IdealPink.DEFAULT_PINK, s, "ideal pink");
    }

    /** A new chain of the same design at another level, with fresh state (same seed). */
    public NoiseChain withLevel(double levelDbfs) {
        return new NoiseChain(settings.withLevel(levelDbfs), analog, filter, fidelity, noisePowerGain, describe);
    }

    /** A new chain of the same design with another seed, with fresh state. */
    public NoiseChain withSeed(long seed) {
        return new NoiseChain(settings.withSeed(seed), analog, filter, fidelity, noisePowerGain, describe);
    }

    /**
     * The fidelity of the digital model the chain would use at an output rate: the chosen
     * oversampling factor and each third-octave band's difference from the analog model.
     *
     * @throws org.roseate.digital.UnrenderableModelException when the model cannot be rendered
     */
    public static FidelityReport fidelity(Zpk analog, double sampleRateHz) {
        BandTable bands = fidelityBands(sampleRateHz);
        return Oversampling.select(analog, sampleRateHz, bands.lowHz(), bands.highHz(), FIDELITY_TOLERANCE_DB,
                gainMatchHz(bands));
    }

    /**
     * Third-octave bands for fidelity checks: nominal 20 Hz to 20 kHz at audio rates; at lower rates
     * the same three decades scaled to the rate (top band below 0.4535·fs), down to the 0.4 Hz band.
     */
    public static BandTable fidelityBands(double sampleRateHz) {
        double hi = Math.min(Decimator.AUDIO_EDGE_HZ, sampleRateHz * Decimator.AUDIO_EDGE_HZ / 44_100);
        double lo = Math.max(0.4, hi / 1000);
        return BandTable.of(BandFraction.THIRD_OCTAVE, lo, hi);
    }

    private static double gainMatchHz(BandTable bands) {
        double g = Math.sqrt(bands.band(0).midHz() * bands.band(bands.size() - 1).midHz());
        return Math.min(1000, g);
    }

    /**
     * Below this fraction of the output rate the digital response is replaced by the analog model in
     * the noise-power integral: there the bilinear map is exact to (ω/2)² ≈ 1e-8 and the gains are
     * matched, while evaluating sections at ω ≪ 1 rad/sample loses digits to cancellation.
     */
    static final double ANALOG_BELOW_FRACTION_OF_RATE = 2e-4;

    /**
     * (2/(M·fs))·∫₀^{M·fs/2} |H|² df of sections × decimator at the oversampled rate: the analog
     * model from 0 to f₁ = 2e-4·fs (adaptive, {@link LevelCalculator#noisePowerGain}), the digital
     * path from f₁ to M·fs/2 (Gauss–Legendre on a log axis, {@link BandPower}).
     */
    static double pathNoisePower(OversampledFilter f, Zpk analog) {
        double rate = f.factor() * f.outputRateHz();
        double splitHz = ANALOG_BELOW_FRACTION_OF_RATE * f.outputRateHz();
        double low = LevelCalculator.noisePowerGain(hz -> {
            var h = analog.evaluateAtHz(hz);
            return h.re() * h.re() + h.im() * h.im();
        }, 2 * splitHz) * splitHz;
        double high = BandPower.integrate(hz -> {
            var h = f.sections().response(hz).times(f.decimator().response(hz));
            return h.re() * h.re() + h.im() * h.im();
        }, splitHz, rate / 2);
        return (low + high) / (rate / 2);
    }

    @Override
    public int channels() {
        return settings.channels();
    }

    @Override
    public double sampleRateHz() {
        return settings.sampleRateHz();
    }

    public ChainSettings settings() {
        return settings;
    }

    /** Oversampling factor M (1 for white noise). */
    public int oversamplingFactor() {
        return filter == null ? 1 : filter.factor();
    }

    /** Per-band comparison of the digital path with the analog model; empty for white noise. */
    public Optional<FidelityReport> fidelity() {
        return Optional.ofNullable(fidelity);
    }

    /** The digital path, or empty for white noise. */
    public Optional<OversampledFilter> filter() {
        return Optional.ofNullable(filter);
    }

    /** Output variance per unit-variance input of the digital path (1 for white). */
    public double noisePowerGain() {
        return noisePowerGain;
    }

    /** The linear gain applied after the filter to reach the RMS level. */
    public double gain() {
        return gain;
    }

    public String describe() {
        return describe;
    }

    @Override
    public void render(double[] interleaved, int frames) {
        int ch = settings.channels();
        int streams = sources.length;
        int factor = oversamplingFactor();
        int done = 0;
        while (done < frames) {
            int n = Math.min(BLOCK, frames - done);
            for (int s = 0; s < streams; s++) {
                double[] o = out[s];
                if (filter == null) {
                    sources[s].fill(o, 0, n);
                } else {
                    sources[s].fill(white, 0, n * factor);
                    runtimes[s].process(white, o, n);
                }
                for (int i = 0; i < n; i++) {
                    o[i] *= gain;
                }
                if (limiter != null) {
                    limiter.process(o, 0, n);
                }
            }
            int base = done * ch;
            for (int i = 0; i < n; i++) {
                for (int c = 0; c < ch; c++) {
                    interleaved[base + i * ch + c] = out[streams == 1 ? 0 : c][i];
                }
            }
            done += n;
        }
    }

    /** Restarts the noise and the steady-state start: the next render repeats the first. */
    public void reset() {
        WhiteNoiseSource root = new WhiteNoiseSource(settings.seed(), settings.distribution());
        sources[0] = root;
        for (int c = 1; c < sources.length; c++) {
            sources[c] = root.split();
        }
        for (OversampledFilter.Runtime r : runtimes) {
            if (r != null) {
                r.reset();
            }
        }
        startStationary();
    }
}
