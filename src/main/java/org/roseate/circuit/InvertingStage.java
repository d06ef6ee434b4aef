package org.roseate.circuit;

import java.util.LinkedHashMap;
import java.util.Map;
import java.util.Objects;
import java.util.Optional;
import java.util.function.UnaryOperator;

/**
 * An inverting op-amp stage: H = −Zf/Zin with an ideal op-amp, or with a single-pole op-amp
 * H = −(Zf/Zin) / (1 + (1 + Zf/Zin)/A).
 */
public record InvertingStage(Network input, Network feedback, Optional<OpAmp> opamp) implements Stage {
    public static final String KIND = "inverting";

    public InvertingStage {
        Objects.requireNonNull(input, "input");
        Objects.requireNonNull(feedback, "feedback");
        Objects.requireNonNull(opamp, "opamp");
    }

    @Override
    public String kind() {
        return KIND;
    }

    @Override
    public Map<String, Network> networks() {
        return Stage.roles("input", input, "feedback", feedback);
    }

    @Override
    public Stage mapNetworks(UnaryOperator<Network> f) {
        return new InvertingStage(f.apply(input), f.apply(feedback), opamp);
    }

    /** Nodes in → input → m → feedback → out; U1 with plus at gnd, minus at m, output at out. */
    @Override
    public CircuitStage asCircuit() {
        Map<String, Network> b = new LinkedHashMap<>();
        b.put("in m", input);
        b.put("m out", feedback);
        return new CircuitStage("in", "out", b,
                Map.of("U1", new CircuitOpAmp(CircuitStage.GROUND, "m", "out", opamp.orElse(OpAmp.IDEAL))));
    }
}
