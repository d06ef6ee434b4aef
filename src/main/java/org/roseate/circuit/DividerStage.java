package org.roseate.circuit;

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
}
