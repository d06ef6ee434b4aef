package org.roseate.circuit;

import java.util.Objects;

/**
 * An op-amp placed in a {@link CircuitStage}: the nodes of its pins and its model. The power pins
 * are not modelled; the output is an ideal controlled source referred to {@code gnd}.
 *
 * @param plus   node of the non-inverting input
 * @param minus  node of the inverting input
 * @param output node driven by the output; never {@code gnd} or the stage's input node
 * @param model  the op-amp model ({@link OpAmp#IDEAL} when the file gives no {@code gbwHz})
 */
public record CircuitOpAmp(String plus, String minus, String output, OpAmp model) {
    public CircuitOpAmp {
        Objects.requireNonNull(plus, "plus");
        Objects.requireNonNull(minus, "minus");
        Objects.requireNonNull(output, "output");
        Objects.requireNonNull(model, "model");
    }
}
