package org.roseate.circuit;

import java.util.List;
import java.util.Map;
import java.util.function.Consumer;

/** Two or more networks in series: the impedances add. */
public record Series(List<Network> parts) implements Network {
    public Series {
        parts = List.copyOf(parts);
        if (parts.size() < 2) {
            throw new IllegalArgumentException("a series chain needs at least two parts, got " + parts.size());
        }
    }

    @Override
    public void forEachComponent(Consumer<Component> action) {
        parts.forEach(p -> p.forEachComponent(action));
    }

    @Override
    public Network withValues(Map<String, Double> valuesByDesignator) {
        return new Series(parts.stream().map(p -> p.withValues(valuesByDesignator)).toList());
    }

    @Override
    public String toExpression(boolean nested) {
        return Chains.join(parts, " + ", nested);
    }
}
