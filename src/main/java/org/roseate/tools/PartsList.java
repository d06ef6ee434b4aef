package org.roseate.tools;

import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import org.roseate.circuit.Component;
import org.roseate.circuit.Design;
import org.roseate.value.ComponentKind;
import org.roseate.value.ESeries;
import org.roseate.value.EngineeringValue;
import org.roseate.value.Tolerance;

/** A bill of materials for a design, with standard-series membership and buying advice. */
public final class PartsList {
    /** Advice for capacitors in filter networks (common practice). */
    public static final String CAPACITOR_ADVICE = "C0G/NP0 ceramic, or polypropylene/polystyrene film; "
            + "avoid high-k ceramics (X7R, Y5V): their value moves with voltage and temperature (common practice)";
    /** Advice for resistors (common practice). */
    public static final String RESISTOR_ADVICE = "metal film, 1 %: low noise and low temperature coefficient (common practice)";
    /** Advice for inductors (common practice). */
    public static final String INDUCTOR_ADVICE = "shielded, low-loss core; check saturation current and self-resonance (common practice)";

    private PartsList() {
    }

    /**
     * One part.
     *
     * @param letterCode IEC 60062 letter code, e.g. "4k7"
     * @param si         SI text, e.g. "4.7 kΩ"
     * @param series     the E-series (IEC 60063) that contain the value, smallest first; empty
     *                   when none does
     * @param nearestE24 the nearest E24 value (Ω, F, H)
     * @param nearestE96 the nearest E96 value
     * @param tolerance  from the design's tolerance map, if any
     * @param advice     what to buy, by kind (common practice)
     */
    public record Part(String designator, ComponentKind kind, double value, String letterCode, String si,
            List<ESeries> series, double nearestE24, double nearestE96, Optional<Tolerance> tolerance, String advice) {
        public Part {
            series = List.copyOf(series);
        }
    }

    /** Every component of the design, in design order. */
    public static List<Part> of(Design design) {
        List<Part> out = new ArrayList<>();
        for (Component c : design.components()) {
            List<ESeries> in = new ArrayList<>();
            for (ESeries e : ESeries.values()) {
                if (e.contains(c.value())) {
                    in.add(e);
                }
            }
            String advice = switch (c.kind()) {
                case RESISTOR -> RESISTOR_ADVICE;
                case CAPACITOR -> CAPACITOR_ADVICE;
                default -> INDUCTOR_ADVICE;
            };
            out.add(new Part(c.designator(), c.kind(), c.value(), EngineeringValue.format(c.value(), c.kind()),
                    EngineeringValue.formatSi(c.value(), c.kind()), in, ESeries.E24.nearest(c.value()),
                    ESeries.E96.nearest(c.value()), design.toleranceOf(c), advice));
        }
        return out;
    }
}
