package org.roseate.circuit;

import java.util.LinkedHashMap;
import java.util.Map;
import java.util.Optional;
import java.util.function.UnaryOperator;

/**
 * One stage of a design's cascade. Each kind names its networks by role (the keys of the design
 * file) and has a transfer function H(s) built from their impedances.
 */
public sealed interface Stage permits InvertingStage, NonInvertingStage, DividerStage, CircuitStage {

    /** The kind as written in design files: {@code inverting}, {@code noninverting}, {@code divider}, {@code circuit}. */
    String kind();

    /** The networks by role, in file order; optional roles that are absent are left out. */
    Map<String, Network> networks();

    /** The op-amp model, if any (never present on a divider). */
    Optional<OpAmp> opamp();

    /** A copy of this stage with each network replaced by {@code f(network)}. */
    Stage mapNetworks(UnaryOperator<Network> f);

    /**
     * The same stage written as a {@link CircuitStage} (nodes {@code in}, {@code m}, {@code out};
     * its op-amp {@code U1}), with the same transfer function.
     */
    CircuitStage asCircuit();

    static Map<String, Network> roles(Object... roleThenNetwork) {
        Map<String, Network> m = new LinkedHashMap<>();
        for (int i = 0; i < roleThenNetwork.length; i += 2) {
            if (roleThenNetwork[i + 1] != null) {
                m.put((String) roleThenNetwork[i], (Network) roleThenNetwork[i + 1]);
            }
        }
        return m;
    }
}
