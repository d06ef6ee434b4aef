package org.roseate.circuit;

import java.util.LinkedHashMap;
import java.util.Map;
import java.util.Objects;
import java.util.Optional;
import java.util.function.UnaryOperator;

/**
 * A non-inverting op-amp stage: H = 1 + Zf/Zg with an ideal op-amp, or with a single-pole op-amp
 * H = (1 + Zf/Zg) / (1 + (1 + Zf/Zg)/A).
 */
public record NonInvertingStage(Network ground, Network feedback, Optional<OpAmp> opamp) implements Stage {
    public static final String KIND = "noninverting";

    public NonInvertingStage {
        Objects.requireNonNull(ground, "ground");
        Objects.requireNonNull(feedback, "feedback");
        Objects.requireNonNull(opamp, "opamp");
    }

    @Override
    public String kind() {
        return KIND;
    }

    @Override
    public Map<String, Network> networks() {
        return Stage.roles("ground", ground, "feedback", feedback);
    }

    @Override
    public Stage mapNetworks(UnaryOperator<Network> f) {
        return new NonInvertingStage(f.apply(ground), f.apply(feedback), opamp);
    }

    /** Ground network from m to gnd, feedback from m to out; U1 with plus at in, minus at m. */
    @Override
    public CircuitStage asCircuit() {
        Map<String, Network> b = new LinkedHashMap<>();
        b.put("m gnd", ground);
        b.put("m out", feedback);
        return new CircuitStage("in", "out", b,
                Map.of("U1", new CircuitOpAmp("in", "m", "out", opamp.orElse(OpAmp.IDEAL))));
    }
}
