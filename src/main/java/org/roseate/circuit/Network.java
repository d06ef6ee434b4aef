package org.roseate.circuit;

import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.function.Consumer;

/**
 * A two-terminal network of ideal resistors, capacitors and inductors: a single component, or
 * parts joined in series or in parallel. Immutable; built by {@link NetworkParser}.
 */
public sealed interface Network permits Component, Series, Parallel {

    /** Visits every component, left to right as written. */
    void forEachComponent(Consumer<Component> action);

    /** A copy with the values of the named designators replaced (values in Ω, F or H). */
    Network withValues(Map<String, Double> valuesByDesignator);

    /**
     * The expression that parses back to this network, values in IEC 60062 letter code;
     * {@code nested} is true when the caller joins this network to siblings and needs
     * parentheses around a multi-part chain.
     */
    String toExpression(boolean nested);

    default String toExpression() {
        return toExpression(false);
    }

    default List<Component> components() {
        List<Component> list = new ArrayList<>();
        forEachComponent(list::add);
        return list;
    }
}
