package org.roseate.model;

import java.util.ArrayList;
import java.util.List;
import org.roseate.circuit.Design;

/**
 * The exact analog model of a design: the cascade of its stages (each driving the next through
 * an ideal buffer). Evaluates H(j·2π·f) with complex arithmetic on the impedance tree, and offers
 * the same function as a rational function and in zero-pole-gain form. Immutable, thread-safe,
 * and cheap to build (a design edit builds a new model in microseconds).
 */
public final class CircuitModel {
    /** Frequency scale of the rational functions: ω0 = 2π·1 kHz, the log-centre of audio work. */
    public static final double OMEGA_SCALE_RAD_PER_S = 2 * Math.PI * 1000;

    private final Design design;
    private final List<StageModel> stages;
    private final int scratchDepth;
    /** One thread's buffers for {@link #magnitudeSquared(double)}; created on a thread's first call. */
    private final ThreadLocal<Scratch> scalarScratch = ThreadLocal.withInitial(this::newScratch);

    private CircuitModel(Design design, String source) {
        this.design = design;
        List<StageModel> list = new ArrayList<>();
        int depth = 1;
        for (int i = 0; i < design.stages().size(); i++) {
            StageModel m = new StageModel(design.stages().get(i), i + 1, OMEGA_SCALE_RAD_PER_S, source);
            list.add(m);
            depth = Math.max(depth, m.scratchDepth());
        }
        this.stages = List.copyOf(list);
        this.scratchDepth = depth;
    }

    /**
     * Builds the model; {@code source} names the design in error messages (a file name).
     *
     * @throws org.roseate.circuit.DesignException if a network is open or short at every
     *                                             frequency, or values overflow
     */
    public static CircuitModel of(Design design, String source) {
        return new CircuitModel(design, source);
    }

    public Design design() {
        return design;
    }

    public List<StageModel> stages() {
        return stages;
    }

    /** H(j·2π·hz) of the cascade; hz &gt; 0. */
    public Complex response(double hz) {
        Scratch sc = scalarScratch.get();
        evaluate(hz, sc);
        return new Complex(sc.h()[2], sc.h()[3]);
    }

    /**
     * H(j·2π·hz[i]) of the cascade into {@code re[i]}, {@code im[i]}. Allocates only a small
     * scratch per call, none per point.
     *
     * @param hz frequencies in Hz, each finite and &gt; 0
     */
    public void response(double[] hz, double[] re, double[] im) {
        Scratch sc = newScratch();
        for (int i = 0; i < hz.length; i++) {
            evaluate(hz[i], sc);
            re[i] = sc.h()[2];
            im[i] = sc.h()[3];
        }
    }

    /**
     * Buffers for one thread's evaluations: the stages' stacks, one stage's H and the product
     * (h[0..1] and h[2..3]) and each stage's nodal workspace.
     */
    private record Scratch(double[][] stack, double[] h, NodalModel.Workspace[] nodal) {
    }

    private Scratch newScratch() {
        NodalModel.Workspace[] nodal = new NodalModel.Workspace[stages.size()];
        for (int k = 0; k < nodal.length; k++) {
            nodal[k] = stages.get(k).nodalWorkspace();
        }
        return new Scratch(new double[][] {new double[scratchDepth], new double[scratchDepth], new double[2], new double[2]},
                new double[4], nodal);
    }

    /** H(j·2π·hz) of the cascade into sc.h[2] (real) and sc.h[3] (imaginary). */
    private void evaluate(double hz, Scratch sc) {
        double w = 2 * Math.PI * hz;
        double[] h = sc.h();
        double accR = 1;
        double accI = 0;
        for (int k = 0; k < sc.nodal().length; k++) {
            stages.get(k).evaluate(w, sc.stack(), sc.nodal()[k], h);
            double t = accR * h[0] - accI * h[1];
            accI = accR * h[1] + accI * h[0];
            accR = t;
        }
        h[2] = accR;
        h[3] = accI;
    }

    /** The response on the given frequencies, as a record with dB and degrees. */
    public FrequencyResponse response(double[] hz) {
        double[] re = new double[hz.length];
        double[] im = new double[hz.length];
        response(hz, re, im);
        return new FrequencyResponse(hz.clone(), re, im);
    }

    /**
     * |H(j·2π·hz)|², the power gain for noise at that frequency. Band integrals and slope fits call
     * this point by point, thousands of times per analysis, so it reuses one set of buffers per
     * thread ({@link #scalarScratch}) instead of allocating the stages' workspaces at each call; the
     * arithmetic is the same as {@link #response(double[], double[], double[])}'s.
     */
    public double magnitudeSquared(double hz) {
        Scratch sc = scalarScratch.get();
        evaluate(hz, sc);
        double[] h = sc.h();
        return h[2] * h[2] + h[3] * h[3];
    }

    /** The cascade's rational function in x = s/ω0, ω0 = {@link #OMEGA_SCALE_RAD_PER_S}. */
    public RationalFunction rational() {
        RationalFunction r = stages.get(0).rational();
        for (int i = 1; i < stages.size(); i++) {
            r = r.times(stages.get(i).rational());
        }
        return r;
    }

    /** Zeros, poles (rad/s) and gain of the cascade: the stages' own, concatenated. */
    public Zpk zpk() {
        Zpk z = stages.get(0).zpk();
        for (int i = 1; i < stages.size(); i++) {
            z = z.cascade(stages.get(i).zpk());
        }
        return z;
    }

    /** Poles, one entry per real pole and one per complex pair (upper member), by frequency. */
    public List<Root> poles() {
        return reportable(zpk().poles());
    }

    /** Zeros, as {@link #poles()}. */
    public List<Root> zeros() {
        return reportable(zpk().zeros());
    }

    private static List<Root> reportable(List<Complex> roots) {
        List<Root> out = new ArrayList<>();
        for (Complex z : roots) {
            if (z.im() >= 0) {
                out.add(new Root(z));
            }
        }
        out.sort(java.util.Comparator.comparingDouble(Root::hz));
        return out;
    }
}
