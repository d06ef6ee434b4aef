package org.roseate.tools;

import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import org.roseate.circuit.CircuitStage;
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

    /**
     * Parts of equal kind, value and tolerance, to buy together.
     *
     * @param designators the parts, in design order
     * @param first       the first of them (value, series, advice)
     */
    public record Group(List<String> designators, Part first) {
        public Group {
            designators = List.copyOf(designators);
        }

        public int quantity() {
            return designators.size();
        }
    }

    /**
     * An op-amp of the design with its model keys as the design file writes them.
     *
     * @param name         a circuit stage's op-amp: its designator from the file's {@code opamps}
     *                     map (e.g. "U2"); an older-kind stage's single op-amp, which has no
     *                     designator in the file: "U" and the stage number, or, when a circuit
     *                     op-amp of the design already uses that name, the next "U" number used by
     *                     no other op-amp of the design
     * @param stage        the stage, 1-based
     * @param gbwHz        the gain-bandwidth product, Hz ({@code gbwHz})
     * @param openLoopGain the DC open-loop gain, ratio ({@code openLoopGain})
     */
    public record OpAmpEntry(String name, int stage, double gbwHz, double openLoopGain) {
    }

    /** Equal parts grouped, in the order of their first appearance. */
    public static List<Group> grouped(Design design) {
        java.util.Map<String, List<Part>> byKey = new java.util.LinkedHashMap<>();
        for (Part p : of(design)) {
            String key = p.kind() + "|" + p.value() + "|" + p.tolerance().map(Tolerance::fraction).orElse(-1.0);
            byKey.computeIfAbsent(key, k -> new ArrayList<>()).add(p);
        }
        List<Group> out = new ArrayList<>();
        byKey.values().forEach(ps -> out.add(new Group(ps.stream().map(Part::designator).toList(), ps.get(0))));
        return out;
    }

    /**
     * The op-amps with a model in the design (an ideal op-amp has none), stage by stage and, within
     * a circuit stage, in the file's order; names as {@link OpAmpEntry#name()} says.
     */
    public static List<OpAmpEntry> opAmps(Design design) {
        java.util.Set<String> taken = new java.util.HashSet<>();
        for (var st : design.stages()) {
            if (st instanceof CircuitStage c) {
                taken.addAll(c.opamps().keySet());
            }
        }
        List<OpAmpEntry> out = new ArrayList<>();
        for (int s = 0; s < design.stages().size(); s++) {
            final int stage = s + 1;
            if (design.stages().get(s) instanceof CircuitStage c) {
                c.opamps().forEach((name, op) -> {
                    if (!op.model().isIdeal()) {
                        out.add(new OpAmpEntry(name, stage, op.model().gbwHz(), op.model().openLoopGain()));
                    }
                });
                continue;
            }
            var model = design.stages().get(s).opamp();
            if (model.isPresent()) {
                int n = stage;
                while (taken.contains(ToleranceOverrides.OPAMP_GBW_KEY + n)) {
                    n++;
                }
                String name = ToleranceOverrides.OPAMP_GBW_KEY + n;
                taken.add(name);
                out.add(new OpAmpEntry(name, stage, model.get().gbwHz(), model.get().openLoopGain()));
            }
        }
        return out;
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
