package org.roseate.tools;

import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.OptionalDouble;
import org.roseate.circuit.Component;
import org.roseate.circuit.Design;
import org.roseate.circuit.DividerStage;
import org.roseate.circuit.InvertingStage;
import org.roseate.circuit.Network;
import org.roseate.circuit.OpAmp;
import org.roseate.circuit.Parallel;
import org.roseate.circuit.Series;
import org.roseate.compare.FrequencyRange;
import org.roseate.value.ComponentKind;

/**
 * Starting designs for the fitter: the pink-filter ladders R0 || C0 || N×(Ri + Ci). Starting
 * values follow |Z| ∝ f^(−1/2) (the impedance whose square magnitude falls 3.01 dB per octave):
 * branch corners 1/(2π·Ri·Ci) spread geometrically over the range, R0 taking over below it and
 * C0 above it. They only seed the optimiser, which moves every one.
 */
public final class Topologies {
    private Topologies() {
    }

    /**
     * An inverting stage: input R1, feedback R2 || C1 || (R3 + C2) || … with {@code branches}
     * series-RC branches.
     *
     * @param branches   1 to 12
     * @param inputOhms  the input resistor, or empty to start it where the stage has unity gain
     *                   at 1 kHz (the fitter may then free it to hold a gain)
     */
    public static Design invertingLadder(int branches, OptionalDouble inputOhms, Optional<OpAmp> opamp,
            PartLimits limits, FrequencyRange range) {
        double zRef = Math.sqrt(limits.minOhms() * limits.maxOhms()) / 3;
        Network feedback = ladder(branches, 2, 1, zRef, limits, range);
        double rin = inputOhms.orElse(zRef);
        Component input = new Component("R1", ComponentKind.RESISTOR, rin);
        String desc = "Inverting pink ladder, " + branches + " series-RC branches, fitted by roseate fit.";
        Design d = new Design("Fitted inverting ladder (" + branches + " branches)", desc,
                List.of(new InvertingStage(input, feedback, opamp)), Map.of());
        if (inputOhms.isEmpty()) {
            double unity = rin * org.roseate.model.CircuitModel.of(d, d.name()).response(1000).abs();
            d = d.withValue("R1", clamp(unity, limits.minOhms(), limits.maxOhms()));
        }
        return d;
    }

    /**
     * A passive divider: series R1 into the shunt R2 || C1 || (R3 + C2) || …, with an optional
     * fixed load resistor (in parallel with the shunt; the next designator after the ladder).
     *
     * @param branches  1 to 12
     * @param loadOhms  the load, Ω, or empty for none (an ideal buffer follows)
     */
    public static Design dividerLadder(int branches, OptionalDouble loadOhms, PartLimits limits, FrequencyRange range) {
        double zRef = Math.sqrt(limits.minOhms() * limits.maxOhms()) / 6;
        Network shunt = ladder(branches, 2, 1, zRef, limits, range);
        double r0 = shunt.components().get(0).value();
        double rs = clamp(8 * r0, limits.minOhms(), limits.maxOhms());
        Component series = new Component("R1", ComponentKind.RESISTOR, rs);
        Optional<Network> load = loadOhms.isPresent()
                ? Optional.of(new Component("R" + (branches + 3), ComponentKind.RESISTOR, loadOhms.getAsDouble()))
                : Optional.empty();
        String desc = "Passive pink divider ladder, " + branches + " series-RC branches"
                + (load.isPresent() ? ", loaded" : "") + ", fitted by roseate fit.";
        return new Design("Fitted divider ladder (" + branches + " branches)", desc,
                List.of(new DividerStage(series, shunt, load)), Map.of());
    }

    private static Network ladder(int branches, int firstR, int firstC, double zRef, PartLimits limits, FrequencyRange range) {
        if (branches < 1 || branches > 12) {
            throw new IllegalArgumentException("branches=" + branches + " must be 1 to 12");
        }
        double lo = range.loHz();
        double hi = range.hiHz();
        double fc = Math.sqrt(lo * hi);
        List<Network> parts = new ArrayList<>();
        int r = firstR;
        int c = firstC;
        parts.add(resistor(r++, zAt(zRef, fc, lo / 2), limits));
        double fTop = 2 * hi;
        parts.add(capacitor(c++, 1 / (2 * Math.PI * fTop * zAt(zRef, fc, fTop)), limits));
        for (int i = 0; i < branches; i++) {
            double fi = lo * Math.pow(hi / lo, (i + 0.5) / branches);
            double ri = clamp(zAt(zRef, fc, fi), limits.minOhms(), limits.maxOhms());
            Component rc = resistor(r++, ri, limits);
            Component cc = capacitor(c++, 1 / (2 * Math.PI * fi * ri), limits);
            parts.add(new Series(List.of(rc, cc)));
        }
        return new Parallel(parts);
    }

    private static double zAt(double zRef, double fcHz, double hz) {
        return zRef * Math.sqrt(fcHz / hz);
    }

    private static Component resistor(int n, double ohms, PartLimits limits) {
        return new Component("R" + n, ComponentKind.RESISTOR, clamp(ohms, limits.minOhms(), limits.maxOhms()));
    }

    private static Component capacitor(int n, double farads, PartLimits limits) {
        return new Component("C" + n, ComponentKind.CAPACITOR, clamp(farads, limits.minFarads(), limits.maxFarads()));
    }

    /**
     * The parts that feed the signal into the first stage and set its gain against the rest: the
     * first stage's {@code input} network (an inverting stage) or {@code series} network (a
     * divider); none for a non-inverting stage, whose input goes straight to the op-amp. Looked up
     * by network role, so any stage kind with a role of that name is served the same way.
     */
    public static List<String> inputParts(Design design) {
        var networks = design.stages().get(0).networks();
        List<String> out = new ArrayList<>();
        for (String role : List.of("input", "series")) {
            Network n = networks.get(role);
            if (n != null) {
                n.components().forEach(c -> out.add(c.designator()));
            }
        }
        return out;
    }

    static double clamp(double v, double lo, double hi) {
        return Math.max(lo, Math.min(hi, v));
    }
}
