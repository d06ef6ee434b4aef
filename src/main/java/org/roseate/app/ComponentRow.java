package org.roseate.app;

import org.roseate.circuit.Component;
import org.roseate.circuit.Design;
import org.roseate.value.ESeries;
import org.roseate.value.EngineeringValue;

/**
 * One row of the component table: a part, its value in IEC 60062 letter code, its tolerance and
 * the nearest standard value of the chosen E-series. Immutable.
 */
record ComponentRow(String designator, double value, String valueText, String toleranceText, String nearestText,
        boolean standard) {

    static ComponentRow of(Design design, Component c, ESeries series) {
        double nearest = series.nearest(c.value());
        String tol = design.toleranceOf(c).map(Object::toString).orElse("—");
        return new ComponentRow(c.designator(), c.value(), EngineeringValue.format(c.value(), c.kind()), tol,
                EngineeringValue.format(nearest, c.kind()), series.contains(c.value()));
    }
}
