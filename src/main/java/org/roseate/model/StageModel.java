package org.roseate.model;

import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import org.roseate.circuit.CircuitStage;
import org.roseate.circuit.DesignException;
import org.roseate.circuit.DividerStage;
import org.roseate.circuit.InvertingStage;
import org.roseate.circuit.Network;
import org.roseate.circuit.NonInvertingStage;
import org.roseate.circuit.OpAmp;
import org.roseate.circuit.Parallel;
import org.roseate.circuit.Stage;

/**
 * The exact model of one stage: its transfer function H(jω) evaluated on the impedance tree, and
 * the same function as a rational function in s with its poles, zeros and gain.
 *
 * <p>Formulas, with G = Zf/Zin (inverting) or Zf/Zg (non-inverting) and the single-pole op-amp
 * A(s) = A0/(1 + s·τ), τ = A0/(2π·GBW): inverting H = −G/(1 + (1 + G)/A), ideal −G;
 * non-inverting H = (1 + G)/(1 + (1 + G)/A), ideal 1 + G; divider H = Zsh/(Zse + Zsh) with the
 * load in parallel with the shunt. A {@code circuit} stage is evaluated by its {@link NodalModel}
 * (modified nodal analysis), whose rational function comes from the nodal determinant. Immutable
 * and thread-safe.
 */
public final class StageModel {
    private enum Kind { INVERTING, NONINVERTING, DIVIDER, CIRCUIT }

    private final Stage stage;
    private final Kind kind;
    private final ImpedanceProgram a;
    private final ImpedanceProgram b;
    private final double tauSeconds;
    private final double openLoopGain;
    private final RationalFunction rational;
    private final Zpk zpk;
    private final NodalModel nodal;

    StageModel(Stage stage, int number, double omegaScaleRadPerS, String source) {
        this.stage = stage;
        if (stage instanceof CircuitStage c) {
            kind = Kind.CIRCUIT;
            nodal = new NodalModel(c, number, source, omegaScaleRadPerS);
            a = null;
            b = null;
            tauSeconds = 0;
            openLoopGain = Double.POSITIVE_INFINITY;
            rational = nodal.rational();
            zpk = buildZpk(rational);
            return;
        }
        nodal = null;
        Network first;
        Network second;
        if (stage instanceof InvertingStage s) {
            kind = Kind.INVERTING;
            first = s.feedback();
            second = s.input();
        } else if (stage instanceof NonInvertingStage s) {
            kind = Kind.NONINVERTING;
            first = s.feedback();
            second = s.ground();
        } else {
            DividerStage s = (DividerStage) stage;
            kind = Kind.DIVIDER;
            first = s.load().<Network>map(l -> new Parallel(List.of(s.shunt(), l))).orElse(s.shunt());
            second = s.series();
        }
        for (Map.Entry<String, Network> e : stage.networks().entrySet()) {
            checkNotDegenerate(e.getValue(), omegaScaleRadPerS, source, number, e.getKey());
        }
        a = ImpedanceProgram.compile(first);
        b = ImpedanceProgram.compile(second);
        Optional<OpAmp> op = stage.opamp();
        tauSeconds = op.map(OpAmp::poleTimeConstantSeconds).orElse(0.0);
        openLoopGain = op.map(OpAmp::openLoopGain).orElse(Double.POSITIVE_INFINITY);
        rational = buildRational(first, second, op, omegaScaleRadPerS);
        if (!rational.numerator().isFinite() || !rational.denominator().isFinite()
                || rational.numerator().isZero() || rational.denominator().isZero()) {
            throw new DesignException(source + ": stage " + number + ": component values are out of range "
                    + "(the transfer function cannot be represented)", number, null, 0);
        }
        zpk = buildZpk(rational);
    }

    private static void checkNotDegenerate(Network n, double w0, String source, int number, String role) {
        Polynomial[] z = RationalBuilder.impedance(n, w0);
        String what = null;
        if (!z[0].isFinite() || !z[1].isFinite()) {
            what = "its values are out of range (impedance overflows)";
        } else if (z[0].isZero()) {
            what = "it is a short circuit at every frequency";
        } else if (z[1].isZero()) {
            what = "it is an open circuit at every frequency";
        }
        if (what != null) {
            throw new DesignException(source + ": stage " + number + " " + role + ": " + what
                    + "; check the values", number, role, 0);
        }
    }

    private RationalFunction buildRational(Network first, Network second, Optional<OpAmp> op, double w0) {
        Polynomial[] za = RationalBuilder.impedance(first, w0);
        Polynomial[] zb = RationalBuilder.impedance(second, w0);
        Polynomial num;
        Polynomial den;
        if (kind == Kind.DIVIDER) {
            // H = Na/Da / (Nb/Db + Na/Da) = Na·Db / (Nb·Da + Na·Db)
            Polynomial nadb = za[0].times(zb[1]);
            num = nadb;
            den = zb[0].times(za[1]).plus(nadb);
        } else {
            // G = P/Q with P = Na·Db, Q = Da·Nb
            Polynomial p = za[0].times(zb[1]);
            Polynomial q = za[1].times(zb[0]);
            Polynomial onePlusG = q.plus(p);
            Polynomial top = kind == Kind.INVERTING ? p.times(-1) : onePlusG;
            if (op.isEmpty()) {
                num = top;
                den = q;
            } else {
                // H = top·A0 / (Q·A0 + (Q + P)·(1 + x·ω0·τ))
                double a0 = op.get().openLoopGain();
                Polynomial pole = new Polynomial(1, w0 * op.get().poleTimeConstantSeconds());
                num = top.times(a0);
                den = q.times(a0).plus(onePlusG.times(pole));
            }
        }
        Polynomial[] pr = RationalBuilder.pair(num, den);
        return new RationalFunction(pr[0], pr[1], w0);
    }

    private static Zpk buildZpk(RationalFunction r) {
        double w0 = r.omegaScaleRadPerS();
        List<Complex> zeros = scaled(r.numerator().roots(), w0);
        List<Complex> poles = scaled(r.denominator().roots(), w0);
        cancelCoincident(zeros, poles);
        // N(s/ω0) = n_m·ω0^(−m)·∏(s − z): H = (n_m/d_n)·ω0^(n − m)·∏(s − z)/∏(s − p)
        int m = r.numerator().degree();
        int n = r.denominator().degree();
        double k = r.numerator().coefficient(m) / r.denominator().coefficient(n) * Math.pow(w0, n - m);
        return new Zpk(zeros, poles, k);
    }

    private static List<Complex> scaled(List<Complex> roots, double w0) {
        List<Complex> out = new ArrayList<>(roots.size());
        for (Complex z : roots) {
            out.add(z.times(w0));
        }
        return out;
    }

    /**
     * Removes pole-zero pairs that coincide to 1e-7 relative: exact cancellations in the circuit
     * (equal time constants) that the polynomial products keep. Real pink networks space their
     * poles and zeros by ratios near 2, far from this threshold.
     */
    private static void cancelCoincident(List<Complex> zeros, List<Complex> poles) {
        for (int i = zeros.size() - 1; i >= 0; i--) {
            Complex z = zeros.get(i);
            for (int j = 0; j < poles.size(); j++) {
                Complex p = poles.get(j);
                if (z.minus(p).abs() <= 1e-7 * Math.max(z.abs(), p.abs())) {
                    zeros.remove(i);
                    poles.remove(j);
                    break;
                }
            }
        }
    }

    public Stage stage() {
        return stage;
    }

    public RationalFunction rational() {
        return rational;
    }

    public Zpk zpk() {
        return zpk;
    }

    int scratchDepth() {
        return kind == Kind.CIRCUIT ? 1 : Math.max(a.stackDepth(), b.stackDepth());
    }

    /** The nodal model of a circuit stage (present only for kind {@code circuit}). */
    public java.util.Optional<NodalModel> nodal() {
        return java.util.Optional.ofNullable(nodal);
    }

    /** Per-call buffers of this stage: null unless it is a circuit stage. */
    NodalModel.Workspace nodalWorkspace() {
        return nodal == null ? null : nodal.workspace();
    }

    /**
     * H(jω) into out[0] (real) and out[1] (imaginary).
     *
     * @param omegaRadPerS &gt; 0
     * @param scratch      four arrays: re/im stacks of length ≥ {@link #scratchDepth()}, then two
     *                     of length ≥ 2
     * @param nodalScratch {@link #nodalWorkspace()} of this stage
     */
    void evaluate(double omegaRadPerS, double[][] scratch, NodalModel.Workspace nodalScratch, double[] out) {
        if (kind == Kind.CIRCUIT) {
            nodal.solveAt(omegaRadPerS, nodalScratch);
            out[0] = nodal.solver().outputRe(nodalScratch.nodal());
            out[1] = nodal.solver().outputIm(nodalScratch.nodal());
            return;
        }
        double[] za = scratch[2];
        double[] zb = scratch[3];
        a.evaluate(omegaRadPerS, scratch[0], scratch[1], za);
        b.evaluate(omegaRadPerS, scratch[0], scratch[1], zb);
        double hr;
        double hi;
        if (kind == Kind.DIVIDER) {
            // Za/(Zb + Za)
            double dr = zb[0] + za[0];
            double di = zb[1] + za[1];
            double m = dr * dr + di * di;
            hr = (za[0] * dr + za[1] * di) / m;
            hi = (za[1] * dr - za[0] * di) / m;
        } else {
            double m = zb[0] * zb[0] + zb[1] * zb[1];
            double gr = (za[0] * zb[0] + za[1] * zb[1]) / m;
            double gi = (za[1] * zb[0] - za[0] * zb[1]) / m;
            double tr = kind == Kind.INVERTING ? -gr : 1 + gr;
            double ti = kind == Kind.INVERTING ? -gi : gi;
            if (Double.isInfinite(openLoopGain)) {
                hr = tr;
                hi = ti;
            } else {
                // 1/A = (1 + jωτ)/A0; H = T / (1 + (1 + G)/A)
                double invAr = 1 / openLoopGain;
                double invAi = omegaRadPerS * tauSeconds / openLoopGain;
                double opr = 1 + gr;
                double dr = 1 + opr * invAr - gi * invAi;
                double di = opr * invAi + gi * invAr;
                double dm = dr * dr + di * di;
                hr = (tr * dr + ti * di) / dm;
                hi = (ti * dr - tr * di) / dm;
            }
        }
        out[0] = hr;
        out[1] = hi;
    }
}
