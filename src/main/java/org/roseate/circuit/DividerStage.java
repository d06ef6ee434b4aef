package org.roseate.circuit;

import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Optional;
import java.util.function.UnaryOperator;

/**
 * A passive divider: H = Zshunt'/(Zseries + Zshunt'), where Zshunt' is the shunt network in
 * parallel with the optional load. Driven from an ideal source.
 */
public record DividerStage(Network series, Network shunt, Optional<Network> load) implements Stage {
    public static final String KIND = "divider";

    public DividerStage {
        Objects.requireNonNull(series, "series");
        Objects.requireNonNull(shunt, "shunt");
        Objects.requireNonNull(load, "load");
    }

    @Override
    public String kind() {
        return KIND;
    }

    @Override
    public Map<String, Network> networks() {
        return Stage.roles("series", series, "shunt", shunt, "load", load.orElse(null));
    }

    @Override
    public Optional<OpAmp> opamp() {
        return Optional.empty();
    }

    @Override
    public Stage mapNetworks(UnaryOperator<Network> f) {
        return new DividerStage(f.apply(series), f.apply(shunt), load.map(f));
    }

    /** Series from in to out, shunt (in parallel with the load, if any) from out to gnd. */
    @Override
    public CircuitStage asCircuit() {
        Map<String, Network> b = new LinkedHashMap<>();
        b.put("in out", series);
        b.put("out gnd", load.<Network>map(l -> new Parallel(List.of(shunt, l))).orElse(shunt));
        return new CircuitStage("in", "out", b, Map.of());
    }
}
