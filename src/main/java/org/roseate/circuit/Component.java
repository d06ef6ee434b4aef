package org.roseate.circuit;

import java.util.Map;
import java.util.function.Consumer;
import org.roseate.value.ComponentKind;
import org.roseate.value.EngineeringValue;

/**
 * One ideal component: its reference designator (such as {@code R1}, {@code C12}), its kind
 * (from the designator's first letter) and its value in Ω, F or H (finite, &gt; 0).
 */
public record Component(String designator, ComponentKind kind, double value) implements Network {
    public Component {
        if (!(value > 0) || !Double.isFinite(value)) {
            throw new IllegalArgumentException(designator + " value=" + value + " must be finite and > 0");
        }
    }

    public Component withValue(double newValue) {
        return new Component(designator, kind, newValue);
    }

    @Override
    public void forEachComponent(Consumer<Component> action) {
        action.accept(this);
    }

    @Override
    public Network withValues(Map<String, Double> valuesByDesignator) {
        Double v = valuesByDesignator.get(designator);
        return v == null ? this : withValue(v);
    }

    @Override
    public String toExpression(boolean nested) {
        return designator + "(" + EngineeringValue.format(value, kind) + ")";
    }
}
