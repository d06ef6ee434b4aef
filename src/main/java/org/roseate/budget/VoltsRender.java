package org.roseate.budget;

import java.util.SplittableRandom;
import org.roseate.circuit.Design;
import org.roseate.circuit.SourceNoise;
import org.roseate.digital.Decimator;
import org.roseate.model.CircuitModel;
import org.roseate.model.Complex;
import org.roseate.model.Zpk;
import org.roseate.noise.ChainSettings;
import org.roseate.noise.FrameSource;
import org.roseate.digital.OversampledFilter;
import org.roseate.digital.StationaryState;
import org.roseate.noise.IdealPink;
import org.roseate.noise.NoiseChain;
import org.roseate.noise.ShapedNoise;
import org.roseate.noise.WhiteNoiseSource;

/**
 * A design's real output in volts, streamed: what the circuit puts out when its {@code source}
 * drives it, with the circuit's own noise added. The samples are volts (not full scale).
 *
 * <p><b>The source</b>, S(f) = d²·(1 + fc/f), is generated at the oversampled rate M·fs and run through
 * the design's digital model (the {@link OversampledFilter} a {@link NoiseChain} of the design chooses:
 * bilinear sections at M·fs, half-band decimators; every third-octave band within ±0.1 dB of the analog
 * model):
 * <ol>
 * <li>its white part: Gaussian samples of standard deviation d·√(M·fs/2), whose one-sided density is
 *     d² up to M·fs/2;</li>
 * <li>its 1/f part, synthesised from log-spaced real poles as the ideal-pink reference is
 *     ({@link IdealPink}), here in parallel rather than as a ladder: K first-order (Ornstein–Uhlenbeck)
 *     processes with corners f_k = fLow·e^{(k+½)Δ} from fLow up to {@link #CORNERS_ABOVE_TOP}·fTop (at most
 *     M·fs/20), Δ ≤ ln(10)/3, each of variance d²·fc·Δ, stepped exactly in time
 *     (x ← a·x + √(1 − a²)·σ·g, a = e^{−2πf_k/(M·fs)}) and started in their stationary distribution. A
 *     log-uniform spread of Lorentzians sums to 1/f: ∫ (2/π)·(1/f_k)/(1 + (f/f_k)²) d(ln f_k) = 1/f; with
 *     spacing Δ the sum ripples by a relative 2·sech(π²/Δ) (Poisson's summation formula; 2e-5 at three per
 *     decade) between fLow·e^Δ and the top corner, flattens below fLow, and the power of its lower end
 *     equals that of d²·fc/f cut sharply at fLow (the sum's corners start half a step above fLow). (The
 *     series ladder of the ideal-pink reference cannot reach 1/T inside the digital chain: its poles there
 *     sit within 1e-7 of the unit circle and the stationary start of the cascade does not converge.)</li>
 * </ol>
 * The filter starts in the stationary state of its white input and then runs 20 of the design's slowest
 * time constants (at most {@link #MAX_WARM_UP_SECONDS}) on the source, discarded, so the 1/f part's
 * share of the state settles too (to e^−20).
 *
 * <p><b>The circuit's own noise</b> (resistors and op-amps as {@link NoiseBudget} computes them at the
 * output, N(f): exact per frequency but with no rational form) is synthesised by {@link ShapedNoise}: a
 * linear-phase FIR kernel whose response equals √N at the grid k·fs/L, scaled so its power is the
 * quadrature integral exactly; only its shape between grid points is interpolated. Its 1/f parts (op-amp
 * corners) are held flat below fLow: the FIR follows N(max(f, fLow)).
 *
 * <p><b>The span.</b> A record of T seconds cannot hold fluctuations slower than about 1/T, and a 1/f
 * density has unbounded power below any frequency; so the rendered band is fLow = 1/T to fTop, the
 * decimator's passband edge ({@link Decimator#audioPassbandEdgeHz}).
 *
 * <p><b>What the render should show</b> ({@link #expectation()}): the density the record holds,
 * integrated over (0, fs/2] by {@link Quadrature}: the digital path's |H_d(f)|² (sections and decimator;
 * the analog model below 2e-4·fs) times the source as generated (d² plus the exact density of each sampled
 * first-order process), plus the own noise as synthesised (N(f), flat below fLow, nothing above fTop). The
 * RMS, the rate of change and Rice's zero-crossing rate follow; for a record sampled at fs the first
 * difference and the sign changes between samples are what can be counted, so the expectation also gives
 * their exact sampled forms, and one record's sampling error (see {@link Expectation}). Beside it,
 * {@link Expectation#budget()} is the budget of the analog circuit over [fLow, fTop]; the two differ by the
 * digital model's fidelity (±0.1 dB per third-octave band) and by what lies outside the band.
 *
 * <p>Not thread-safe; {@link #render} allocates nothing.
 */
public final class VoltsRender implements FrameSource {
    /** Largest FIR kernel for the circuit's own noise. */
    static final int MAX_TAPS = 1 << 16;
    /** The band must span at least this ratio fTop/fLow. */
    public static final double MIN_SPAN_RATIO = 10;
    /** The 1/f part's corners reach this factor above fTop, so its density is 1/f up to fTop. */
    static final double CORNERS_ABOVE_TOP = 10;
    /** Largest spacing of the 1/f part's corners, ln f (three per decade). */
    static final double MAX_CORNER_STEP_LN = Math.log(10) / 3;
    /** Longest warm-up, s of output. */
    public static final double MAX_WARM_UP_SECONDS = 600;

    private final double fs;
    private final int channels;
    private final Expectation expectation;
    private final Stream[] streams;
    private final double[] block;
    private final double[] input;
    private final double[] gauss;
    private final int factor;
    private final double whiteStd;
    private final double[] cornerA;
    private final double[] cornerB;
    private final org.roseate.digital.FidelityReport fidelity;

    /** One independent signal: its generators, its filter, its own-noise synthesis. */
    private static final class Stream {
        final WhiteNoiseSource white;
        final double[] flicker;
        final OversampledFilter.Runtime filter;
        final ShapedNoise self;

        Stream(WhiteNoiseSource white, double[] flicker, OversampledFilter.Runtime filter, ShapedNoise self) {
            this.white = white;
            this.flicker = flicker;
            this.filter = filter;
            this.self = self;
        }
    }

    /**
     * What a render of this design should show, and how far one record may stray.
     *
     * @param fLowHz                the span's low end, 1/T, Hz
     * @param fTopHz                top of the rendered band, Hz
     * @param rmsV                  expected RMS, V
     * @param rmsSigmaV             one standard deviation of one record's RMS about it, V (see {@link VoltsRender#sigma})
     * @param rateRmsVPerS          expected RMS rate of change (2πf)², V/s (the budget's definition)
     * @param sampledRateRmsVPerS   expected RMS of the first difference × fs, V/s: (2·fs·sin(πf/fs))² in place of (2πf)²
     * @param sampledRateSigmaVPerS one standard deviation of one record's first-difference RMS, V/s
     * @param zeroCrossingsPerS     Rice's rate (1/π)·√(∫(2πf)²S/∫S), 1/s
     * @param sampledCrossingsPerS  expected sign changes between samples per second, fs·arccos(ρ₁)/π, 1/s
     * @param sourceRmsV            the source's part of rmsV, V
     * @param selfNoiseRmsV         the circuit's own part of rmsV, V
     * @param seconds               T, s
     * @param flickerCorners        K, the number of first-order processes making the 1/f part (0 without one)
     * @param budget                the budget itself over [fLow, fTop] ({@link NoiseBudget#compute}): what the analog
     *                              circuit puts out in the rendered band, to set beside the record's expectation
     */
    public record Expectation(double fLowHz, double fTopHz, double rmsV, double rmsSigmaV, double rateRmsVPerS,
            double sampledRateRmsVPerS, double sampledRateSigmaVPerS, double zeroCrossingsPerS,
            double sampledCrossingsPerS, double sourceRmsV, double selfNoiseRmsV, double seconds, int flickerCorners,
            BudgetResult budget) {
    }

    private static final int BLOCK = 512;

    /** The shortest duration whose span fits below the band's top at this rate, s. */
    public static double minimumSeconds(double sampleRateHz) {
        return MIN_SPAN_RATIO / Decimator.audioPassbandEdgeHz(sampleRateHz);
    }

    /**
     * Prepares the render.
     *
     * @param design       a design with a {@code source}
     * @param name         the design file's name, for messages
     * @param sampleRateHz output rate, 100 to 384000 Hz
     * @param seconds      T, at least {@link #minimumSeconds}
     * @param channels     1 or 2
     * @param identical    the same signal on every channel
     * @param seed         the seed of every generator
     * @throws IllegalArgumentException without a source or with too short a duration
     * @throws org.roseate.digital.UnrenderableModelException when the model cannot be rendered
     */
    public static VoltsRender of(Design design, String name, double sampleRateHz, double seconds, int channels,
            boolean identical, long seed) {
        return new VoltsRender(design, name, sampleRateHz, seconds, channels, identical, seed);
    }

    private VoltsRender(Design design, String name, double sampleRateHz, double seconds, int channels, boolean identical,
            long seed) {
        SourceNoise src = design.source().orElseThrow(() -> new IllegalArgumentException("the design has no source"));
        if (!(seconds >= minimumSeconds(sampleRateHz))) {
            throw new IllegalArgumentException("seconds=" + seconds + " is below the minimum " + minimumSeconds(sampleRateHz));
        }
        this.fs = sampleRateHz;
        this.channels = channels;
        double fTop = Decimator.audioPassbandEdgeHz(sampleRateHz);
        double fLow = 1 / seconds;
        Zpk h = CircuitModel.of(design, name).zpk();
        NoiseChain chain = NoiseChain.design(h, new ChainSettings(sampleRateHz, 1, false, seed, -20), name);
        OversampledFilter filter = chain.filter().orElseThrow();
        fidelity = chain.fidelity().orElseThrow();
        factor = filter.factor();
        double innerRate = factor * sampleRateHz;
        whiteStd = src.densityVPerRtHz() * Math.sqrt(innerRate / 2);

        double[] corners = new double[0];
        double cornerVariance = 0;
        if (src.flickerCornerHz() > 0) {
            double top = Math.min(fTop * CORNERS_ABOVE_TOP, innerRate / 20);
            double span = Math.log(top / fLow);
            int k = (int) Math.ceil(span / MAX_CORNER_STEP_LN);
            double step = span / k;
            corners = new double[k];
            for (int i = 0; i < k; i++) {
                corners[i] = fLow * Math.exp((i + 0.5) * step);
            }
            cornerVariance = src.densityVPerRtHz() * src.densityVPerRtHz() * src.flickerCornerHz() * step;
        }
        cornerA = new double[corners.length];
        cornerB = new double[corners.length];
        for (int i = 0; i < corners.length; i++) {
            cornerA[i] = Math.exp(-2 * Math.PI * corners[i] / innerRate);
            cornerB[i] = Math.sqrt(-Math.expm1(-4 * Math.PI * corners[i] / innerRate) * cornerVariance);
        }

        NoiseBudget budget = NoiseBudget.of(design, name);
        BudgetResult plain = budget.compute(fLow, fTop, new double[0], org.roseate.bands.BandFraction.OCTAVE);
        expectation = expect(budget, filter, src, cornerA, cornerVariance, fLow, fTop, sampleRateHz, innerRate, seconds, plain);

        // the circuit's own noise on the FIR grid, shared by every stream
        int taps = Math.min(MAX_TAPS, Math.max(256, Integer.highestOneBit((int) Math.min(1 << 29, 8 * sampleRateHz / fLow)) * 2));
        double[] selfGrid = new double[taps / 2 + 1];
        for (int i = 0; i < selfGrid.length; i++) {
            double f = i * sampleRateHz / taps;
            selfGrid[i] = f > fTop ? 0 : budget.outputDensityParts(Math.max(f, fLow))[1];
        }
        double selfPower = expectation.selfNoiseRmsV() * expectation.selfNoiseRmsV();

        block = new double[BLOCK];
        input = new double[BLOCK * factor];
        gauss = new double[BLOCK * factor * (1 + corners.length)];
        StationaryState stationary = StationaryState.of(filter.sections());
        double slowest = slowestTimeConstantSeconds(h);
        long warm = (long) Math.ceil(Math.min(MAX_WARM_UP_SECONDS, 20 * slowest) * sampleRateHz)
                + filter.decimator().historyOutputSamples();
        int n = identical ? 1 : channels;
        SplittableRandom seeds = new SplittableRandom(seed);
        streams = new Stream[n];
        for (int s = 0; s < n; s++) {
            WhiteNoiseSource white = new WhiteNoiseSource(seeds.nextLong());
            double[] x = new double[corners.length];
            for (int i = 0; i < x.length; i++) {
                x[i] = Math.sqrt(cornerVariance) * white.next();
            }
            OversampledFilter.Runtime rt = filter.newRuntime();
            double[] state = new double[stationary.dimension()];
            stationary.draw(white::next, whiteStd, state);
            rt.setSectionState(state);
            long selfSeed = seeds.nextLong();
            ShapedNoise self = selfPower > 0 ? new ShapedNoise(f -> selfGrid[(int) Math.round(f * taps / sampleRateHz)],
                    sampleRateHz, taps, selfPower, new WhiteNoiseSource(selfSeed)) : null;
            streams[s] = new Stream(white, x, rt, self);
            long done = 0;
            while (done < warm) {
                int m = (int) Math.min(BLOCK, warm - done);
                source(streams[s], m);
                done += m;
            }
        }
    }

    /** 1/min|Re p| over the design's poles, s (0 for a design without poles). */
    static double slowestTimeConstantSeconds(Zpk h) {
        double slowest = 0;
        for (Complex p : h.poles()) {
            if (p.re() < 0) {
                slowest = Math.max(slowest, -1 / p.re());
            }
        }
        return slowest;
    }

    /** The next m output samples of the source through the filter, into {@link #block}. */
    private void source(Stream st, int m) {
        int k = cornerA.length;
        int nIn = m * factor;
        st.white.fill(gauss, 0, nIn * (1 + k));
        double[] x = st.flicker;
        int g = 0;
        for (int i = 0; i < nIn; i++) {
            double v = whiteStd * gauss[g++];
            for (int c = 0; c < k; c++) {
                double xc = cornerA[c] * x[c] + cornerB[c] * gauss[g++];
                x[c] = xc;
                v += xc;
            }
            input[i] = v;
        }
        st.filter.process(input, block, m);
    }

    /**
     * The 1/f part's density as rendered: the sum over the first-order processes of the exact density
     * of a sampled AR(1) process at rate R, (2/R)·σ²(1 − a²)/(1 − 2a·cos(2πf/R) + a²), V²/Hz (the
     * Lorentzian (2/π)·σ²/(f_k·(1 + (f/f_k)²)) for f, f_k ≪ R).
     */
    static double flickerDensity(double[] a, double variance, double f, double innerRate) {
        double c = Math.cos(2 * Math.PI * f / innerRate);
        double s = 0;
        for (double ak : a) {
            s += (2 / innerRate) * variance * (1 - ak * ak) / (1 - 2 * ak * c + ak * ak);
        }
        return s;
    }

    /** Below fLow times this the quadrature stops; the rest, (0, floor], is one rectangle of the flat density. */
    private static final double INTEGRATION_FLOOR = 1e-3;
    /**
     * Below this fraction of the output rate the expectation takes the analog response for the digital
     * path's: there the bilinear map is exact to (ω/2)² and the gains are matched, while evaluating the
     * sections at ω ≪ 1 rad/sample loses digits to cancellation (the same split {@link NoiseChain} uses for
     * its level).
     */
    static final double ANALOG_BELOW_FRACTION_OF_RATE = 2e-4;
    /** Quadrature step in ln f over the decimator's transition band, fTop to fs/2. */
    private static final double TRANSITION_STEP_LN = 0.002;

    static Expectation expect(NoiseBudget budget, OversampledFilter filter, SourceNoise src, double[] cornerA,
            double cornerVariance, double fLow, double fTop, double fs, double innerRate, double seconds, BudgetResult plain) {
        double floor = fLow * INTEGRATION_FLOOR;
        Quadrature inBand = Quadrature.of(floor, fTop);
        Quadrature transition = Quadrature.of(fTop, fs / 2, TRANSITION_STEP_LN);
        double analogBelowHz = ANALOG_BELOW_FRACTION_OF_RATE * fs;
        double p0 = 0;
        double pSrc = 0;
        double pSelf = 0;
        double p2 = 0;
        double rate = 0;
        double dRate = 0;
        double dRate2 = 0;
        double lag1 = 0;
        double fc = src.flickerCornerHz();
        double d2 = src.densityVPerRtHz() * src.densityVPerRtHz();
        double selfBelow = budget.outputDensityParts(fLow)[1];
        int n = 1 + inBand.size() + transition.size();
        for (int j = 0; j < n; j++) {
            // j = 0: the rectangle (0, floor] at its top value (the densities are flat there to 1e-6)
            double f;
            double w;
            if (j == 0) {
                f = floor;
                w = floor;
            } else if (j <= inBand.size()) {
                f = inBand.hz()[j - 1];
                w = inBand.weight()[j - 1];
            } else {
                f = transition.hz()[j - 1 - inBand.size()];
                w = transition.weight()[j - 1 - inBand.size()];
            }
            double[] parts = budget.outputDensityParts(Math.max(f, fLow * INTEGRATION_FLOOR));
            double h2 = f < analogBelowHz ? parts[0] / (d2 * (1 + fc / f)) : filter.magnitudeSquared(f);
            double s = h2 * (d2 + flickerDensity(cornerA, cornerVariance, f, innerRate));
            double o = f > fTop ? 0 : f < fLow ? selfBelow : parts[1];
            double p = s + o;
            double w2 = (2 * Math.PI * f) * (2 * Math.PI * f);
            double d = 2 * fs * Math.sin(Math.PI * f / fs);
            double dp = d * d * p;
            pSrc += w * s;
            pSelf += w * o;
            p0 += w * p;
            p2 += w * p * p;
            rate += w * w2 * p;
            dRate += w * dp;
            dRate2 += w * dp * dp;
            lag1 += w * p * Math.cos(2 * Math.PI * f / fs);
        }
        double rho = Math.max(-1, Math.min(1, lag1 / p0));
        double rms = Math.sqrt(p0);
        double dRms = Math.sqrt(dRate);
        return new Expectation(fLow, fTop, rms, sigma(rms, p2, seconds), Math.sqrt(rate), dRms, sigma(dRms, dRate2, seconds),
                Gaussian.zeroCrossingsPerS(p0, rate), fs * Math.acos(rho) / Math.PI, Math.sqrt(pSrc), Math.sqrt(pSelf), seconds,
                cornerA.length, plain);
    }

    /**
     * One standard deviation of one record's RMS: the mean square over T of a Gaussian process of
     * one-sided density S has variance (1/T)·∫S² df when T is long against its correlation time
     * (Bendat &amp; Piersol, Random Data, the variance of a mean-square estimate, from memory; it is
     * 2σ⁴/(T·2B) for noise flat over a band B), and the RMS, its square root, half that relative spread.
     */
    static double sigma(double rms, double integralOfSquare, double seconds) {
        if (!(rms > 0)) {
            return 0;
        }
        double msSigma = Math.sqrt(integralOfSquare / seconds);
        return 0.5 * msSigma / rms;
    }

    /** The digital model's fidelity: each third-octave band against the analog model, and the oversampling. */
    public org.roseate.digital.FidelityReport fidelity() {
        return fidelity;
    }

    public Expectation expectation() {
        return expectation;
    }

    @Override
    public int channels() {
        return channels;
    }

    @Override
    public double sampleRateHz() {
        return fs;
    }

    @Override
    public void render(double[] interleaved, int frames) {
        int done = 0;
        while (done < frames) {
            int n = Math.min(BLOCK, frames - done);
            for (int s = 0; s < streams.length; s++) {
                Stream st = streams[s];
                source(st, n);
                double[] b = block;
                if (st.self != null) {
                    st.self.add(b, 0, n);
                }
                if (streams.length == 1) {
                    for (int c = 0; c < channels; c++) {
                        for (int i = 0; i < n; i++) {
                            interleaved[(done + i) * channels + c] = b[i];
                        }
                    }
                } else {
                    for (int i = 0; i < n; i++) {
                        interleaved[(done + i) * channels + s] = b[i];
                    }
                }
            }
            done += n;
        }
    }
}
