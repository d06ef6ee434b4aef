package org.roseate.digital;

import java.util.List;
import org.roseate.model.Complex;

/**
 * Decimation by 1, 2, 4, 8 or 16 as a cascade of {@link HalfbandDecimator}s. For factor 4 the first stage
 * (4fs → 2fs) only has to keep what would fold onto the audio band, so its stopband starts at
 * 2fs − passbandEdgeHz and it is much shorter; the second stage (2fs → fs) carries the sharp transition
 * from passbandEdgeHz to fs − passbandEdgeHz. Each stage: stopband rejection ≥ {@value #REJECTION_DB} dB,
 * passband ripple ≤ ±{@value #RIPPLE_DB} dB. Immutable.
 */
public final class Decimator {
    /** Stopband rejection of each stage in dB. */
    public static final double REJECTION_DB = 100;
    /** Passband ripple limit of each stage in dB. */
    public static final double RIPPLE_DB = 0.005;
    /** The audio band edge used at 44.1 kHz and above, in Hz (common practice). */
    public static final double AUDIO_EDGE_HZ = 20_000;

    private final int factor;
    private final double outputRateHz;
    private final double passbandEdgeHz;
    private final List<HalfbandDecimator> stages;

    private Decimator(int factor, double outputRateHz, double passbandEdgeHz, List<HalfbandDecimator> stages) {
        this.factor = factor;
        this.outputRateHz = outputRateHz;
        this.passbandEdgeHz = passbandEdgeHz;
        this.stages = List.copyOf(stages);
    }

    /**
     * Upper edge of the third-octave band with nominal midband 20 kHz, in Hz: 10^4.3 · 10^(1/20)
     * (base-10 band edges, IEC 61260-1), 22 387.2 Hz.
     */
    public static final double TOP_BAND_HIGH_HZ = Math.pow(10, 4.3 + 0.05);
    /**
     * At audio rates the passband reaches at most this fraction of the output rate, leaving the
     * half-band filter a transition band of (1 − 2·0.476)·fs to Nyquist and beyond: 2.1 kHz at 44.1 kHz.
     */
    public static final double AUDIO_EDGE_FRACTION_OF_RATE = 0.476;

    /**
     * The audio passband edge for an output rate.
     *
     * <p>From 44.1 kHz up: min(TOP_BAND_HIGH_HZ, 0.476·fs), so at 48 kHz and above the whole 20 kHz
     * third-octave band (to 22 387 Hz) is passed, and at 44.1 kHz the band is passed to 20 992 Hz (its
     * part above 22 050 Hz cannot exist in a 44.1 kHz stream at all). Below 44.1 kHz (control rates) the
     * edge is 20 kHz scaled in proportion, outputRateHz·20000/44100.
     */
    public static double audioPassbandEdgeHz(double outputRateHz) {
        if (outputRateHz >= 44_100) {
            return Math.min(TOP_BAND_HIGH_HZ, AUDIO_EDGE_FRACTION_OF_RATE * outputRateHz);
        }
        return outputRateHz * AUDIO_EDGE_HZ / 44_100;
    }

    /** {@link #design(int, double, double)} with {@link #audioPassbandEdgeHz(double)}. */
    public static Decimator forAudio(int factor, double outputRateHz) {
        return design(factor, outputRateHz, audioPassbandEdgeHz(outputRateHz));
    }

    /**
     * A decimator from factor·outputRateHz down to outputRateHz.
     *
     * @param factor         1, 2, 4, 8 or 16 (a cascade of log2(factor) half-band stages)
     * @param outputRateHz   output rate in Hz, finite and &gt; 0
     * @param passbandEdgeHz edge of the protected band in Hz, 0 &lt; edge &lt; outputRateHz/2
     */
    public static Decimator design(int factor, double outputRateHz, double passbandEdgeHz) {
        if (factor != 1 && factor != 2 && factor != 4 && factor != 8 && factor != 16) {
            throw new IllegalArgumentException("factor=" + factor + " must be 1, 2, 4, 8 or 16");
        }
        if (!(outputRateHz > 0) || !Double.isFinite(outputRateHz)) {
            throw new IllegalArgumentException("outputRateHz=" + outputRateHz + " must be finite and > 0");
        }
        if (!(passbandEdgeHz > 0) || !(passbandEdgeHz < outputRateHz / 2)) {
            throw new IllegalArgumentException("passbandEdgeHz=" + passbandEdgeHz + " must be in (0, "
                    + outputRateHz / 2 + ") Hz");
        }
        // Highest rate first; each stage halves the rate. The early stages have wide transition
        // bands (everything above the final passband edge may fold only onto frequencies that later
        // stages remove), so they come out short.
        List<HalfbandDecimator> stages = new java.util.ArrayList<>();
        for (int m = factor; m >= 2; m /= 2) {
            stages.add(HalfbandDecimator.design(m * outputRateHz, passbandEdgeHz, REJECTION_DB, RIPPLE_DB));
        }
        return new Decimator(factor, outputRateHz, passbandEdgeHz, stages);
    }

    public int factor() {
        return factor;
    }

    public double outputRateHz() {
        return outputRateHz;
    }

    public double inputRateHz() {
        return outputRateHz * factor;
    }

    public double passbandEdgeHz() {
        return passbandEdgeHz;
    }

    /** The stages in processing order (highest rate first); empty for factor 1. */
    public List<HalfbandDecimator> stages() {
        return stages;
    }

    /** Group delay in output samples: Σ K_i / 2^(remaining stages), e.g. K_a/2 + K_b for factor 4. */
    public double groupDelayOutputSamples() {
        double d = 0;
        for (HalfbandDecimator s : stages) {
            d = d / 2 + s.groupDelayOutputSamples();
        }
        return d;
    }

    /**
     * Output samples after which the cascade's output no longer depends on its state before them:
     * every stage's delay line (4·halfLength + 1 of its own input samples) expressed at the output rate,
     * summed, rounded up; 0 for factor 1.
     */
    public int historyOutputSamples() {
        double d = 0;
        int inputPerOutput = factor;
        for (HalfbandDecimator s : stages) {
            d += (4.0 * s.halfLength() + 1) / inputPerOutput;
            inputPerOutput /= 2;
        }
        return (int) Math.ceil(d);
    }

    /** Product of the stage responses at hz (each at its own input rate); 1 for factor 1. */
    public Complex response(double hz) {
        Complex h = Complex.ONE;
        for (HalfbandDecimator s : stages) {
            h = h.times(s.response(hz));
        }
        return h;
    }

    /** A fresh streaming state. */
    public Runtime newRuntime() {
        return new Runtime(this);
    }

    /**
     * Streaming state of the cascade. {@link #process} consumes factor·nOut input samples and writes nOut
     * outputs; allocation-free (an internal scratch buffer is reused in fixed chunks).
     */
    public static final class Runtime {
        /** Output samples per internal chunk. */
        private static final int CHUNK_OUT = 256;
        private final Decimator design;
        private final HalfbandDecimator.Runtime[] stages;
        /** Ping-pong buffers between stages, each CHUNK_OUT·factor/2 long. */
        private final double[][] scratch;

        private Runtime(Decimator design) {
            this.design = design;
            stages = new HalfbandDecimator.Runtime[design.stages.size()];
            for (int i = 0; i < stages.length; i++) {
                stages[i] = design.stages.get(i).newRuntime();
            }
            int len = Math.max(1, CHUNK_OUT * design.factor / 2);
            scratch = new double[][] {new double[len], new double[len]};
        }

        /**
         * @param in       input at factor·outputRateHz, {@code factor·nOut} samples from {@code inOffset}
         * @param out      receives {@code nOut} samples from {@code outOffset}
         * @param nOut     output count ≥ 0
         */
        public void process(double[] in, int inOffset, double[] out, int outOffset, int nOut) {
            int f = design.factor;
            if (nOut < 0 || inOffset < 0 || outOffset < 0 || (long) inOffset + (long) f * nOut > in.length
                    || outOffset > out.length - nOut) {
                throw new IllegalArgumentException("nOut=" + nOut + ", inOffset=" + inOffset + ", outOffset="
                        + outOffset + " outside buffers of length " + in.length + ", " + out.length);
            }
            switch (stages.length) {
                case 0 -> System.arraycopy(in, inOffset, out, outOffset, nOut);
                case 1 -> stages[0].process(in, inOffset, 2 * nOut, out, outOffset);
                default -> {
                    // Chunk by chunk through every stage, halving the count at each.
                    int done = 0;
                    while (done < nOut) {
                        int c = Math.min(nOut - done, CHUNK_OUT);
                        double[] src = in;
                        int srcOff = inOffset + f * done;
                        int n = f * c;
                        for (int s = 0; s < stages.length; s++) {
                            boolean last = s == stages.length - 1;
                            double[] dst = last ? out : scratch[s % 2];
                            int dstOff = last ? outOffset + done : 0;
                            stages[s].process(src, srcOff, n, dst, dstOff);
                            src = dst;
                            srcOff = dstOff;
                            n /= 2;
                        }
                        done += c;
                    }
                }
            }
        }

        /** Clears all stage histories. */
        public void reset() {
            for (HalfbandDecimator.Runtime s : stages) {
                s.reset();
            }
        }
    }
}
