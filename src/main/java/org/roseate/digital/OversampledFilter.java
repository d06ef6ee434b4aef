package org.roseate.digital;

import org.roseate.model.Complex;
import org.roseate.model.Zpk;

/**
 * The complete digital path for one output rate: the analog model discretised at M·fs (M = 1, 2, 4, 8 or 16,
 * prewarped, headroom-scaled sections), then decimated to fs. Immutable; {@link #newRuntime()} gives
 * the running state.
 *
 * <p>Its response at an output-rate frequency f is H_sections(e^{j2πf/(M·fs)}) · H_decimator(f), which
 * is what the runtime does to the audio band (aliases from above fs/2 are suppressed by the decimator's
 * ≥ 100 dB stopband and are not part of this expression).
 */
public final class OversampledFilter {
    private final double outputRateHz;
    private final SosDesign sections;
    private final Decimator decimator;

    private OversampledFilter(double outputRateHz, SosDesign sections, Decimator decimator) {
        this.outputRateHz = outputRateHz;
        this.sections = sections;
        this.decimator = decimator;
    }

    /**
     * Designs the path.
     *
     * @param analog       the analog model (see {@link Bilinear#discretize(Zpk, double, PrewarpRule, double)})
     * @param outputRateHz output rate fs in Hz, finite and &gt; 0
     * @param factor       oversampling factor M: 1, 2, 4, 8 or 16
     * @param rule         prewarping rule used at M·fs
     * @param gainMatchHz  gain-match frequency in Hz, 0 ≤ gainMatchHz &lt; fs/2
     * @throws UnrenderableModelException if the model cannot run at M·fs
     */
    public static OversampledFilter design(Zpk analog, double outputRateHz, int factor, PrewarpRule rule,
            double gainMatchHz) {
        if (factor != 1 && factor != 2 && factor != 4 && factor != 8 && factor != 16) {
            throw new IllegalArgumentException("factor=" + factor + " must be 1, 2, 4, 8 or 16");
        }
        if (!(outputRateHz > 0) || !Double.isFinite(outputRateHz)) {
            throw new IllegalArgumentException("outputRateHz=" + outputRateHz + " must be finite and > 0");
        }
        if (!(gainMatchHz >= 0) || !(gainMatchHz < outputRateHz / 2)) {
            throw new IllegalArgumentException("gainMatchHz=" + gainMatchHz + " must be in [0, "
                    + outputRateHz / 2 + ") Hz");
        }
        DigitalZpk zpk = Bilinear.discretize(analog, factor * outputRateHz, rule, gainMatchHz);
        SosDesign sos = SosDesign.fromZpk(zpk).withHeadroomScaling();
        return new OversampledFilter(outputRateHz, sos, Decimator.forAudio(factor, outputRateHz));
    }

    public int factor() {
        return decimator.factor();
    }

    public double outputRateHz() {
        return outputRateHz;
    }

    /** The sections, running at factor·outputRateHz. */
    public SosDesign sections() {
        return sections;
    }

    public Decimator decimator() {
        return decimator;
    }

    /** Complex response of the whole path at an output-rate frequency hz (0 ≤ hz ≤ fs/2 is meaningful). */
    public Complex response(double hz) {
        return sections.response(hz).times(decimator.response(hz));
    }

    /** 20·log10 |response(hz)| in dB. */
    public double responseDb(double hz) {
        return 20 * Math.log10(response(hz).abs());
    }

    /** |response(hz)|², for band integration. */
    public double magnitudeSquared(double hz) {
        Complex h = response(hz);
        return h.re() * h.re() + h.im() * h.im();
    }

    /** A fresh running state. */
    public Runtime newRuntime() {
        return new Runtime(this);
    }

    /**
     * Running state: sections at M·fs, then the decimator. Allocation-free, one thread at a time;
     * blockwise processing equals whole-signal processing bitwise.
     */
    public static final class Runtime {
        private static final int CHUNK_OUT = 256;
        private final int factor;
        private final SosFilter filter;
        private final Decimator.Runtime decimator;
        private final double[] scratch;

        private Runtime(OversampledFilter design) {
            factor = design.factor();
            filter = new SosFilter(design.sections);
            decimator = design.decimator.newRuntime();
            scratch = new double[CHUNK_OUT * factor];
        }

        /**
         * Consumes {@code factor()·nOut} samples of {@code inAtOversampledRate} (which is not modified) and
         * writes {@code nOut} samples at the output rate.
         *
         * @param nOut ≥ 0, with in.length ≥ factor·nOut and out.length ≥ nOut
         */
        public void process(double[] inAtOversampledRate, double[] out, int nOut) {
            if (nOut < 0 || (long) nOut * factor > inAtOversampledRate.length || nOut > out.length) {
                throw new IllegalArgumentException("nOut=" + nOut + " needs " + (long) nOut * factor
                        + " input and " + nOut + " output samples; have " + inAtOversampledRate.length + ", "
                        + out.length);
            }
            if (factor == 1) {
                filter.process(inAtOversampledRate, out, nOut);
                return;
            }
            int done = 0;
            while (done < nOut) {
                int c = Math.min(nOut - done, CHUNK_OUT);
                int nIn = c * factor;
                System.arraycopy(inAtOversampledRate, done * factor, scratch, 0, nIn);
                filter.process(scratch, 0, nIn);
                decimator.process(scratch, 0, out, done, c);
                done += c;
            }
        }

        public int factor() {
            return factor;
        }

        /**
         * Sets the state of the sections (see {@link SosFilter#setState}); the decimator keeps its own.
         * To start in steady state: set a draw from {@link StationaryState#of} the design's sections,
         * then run and discard {@link Decimator#historyOutputSamples()} outputs of the same input, after which
         * the decimator's history too is a stationary sample.
         */
        public void setSectionState(double[] state) {
            filter.setState(state);
        }

        /** Clears filter and decimator state. */
        public void reset() {
            filter.reset();
            decimator.reset();
        }
    }
}
