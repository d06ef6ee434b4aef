package org.roseate.tools;

import java.util.ArrayList;
import java.util.Collection;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Optional;
import java.util.Set;
import org.roseate.circuit.Component;
import org.roseate.circuit.Design;
import org.roseate.model.CircuitModel;
import org.roseate.value.ComponentKind;

/**
 * Which parts a fit moves and which it keeps, shared by {@code fit} and the window's Fit view so
 * both fit the same thing: held parts stay, inductors are held (the fit frees resistors and
 * capacitors only), every other part is free.
 *
 * @param held      parts kept exactly, in the order given, then the inductors
 * @param free      parts the fit moves, in the design's order
 * @param inductors the inductors held because the fit never moves them
 */
public record FitPlan(List<String> held, List<String> free, List<String> inductors) {
    public FitPlan {
        held = List.copyOf(held);
        free = List.copyOf(free);
        inductors = List.copyOf(inductors);
    }

    /** Splits {@code start}'s parts into held, free and held inductors. */
    public static FitPlan of(Design start, Collection<String> held) {
        Set<String> keep = new LinkedHashSet<>(held);
        List<String> inductors = new ArrayList<>();
        List<String> free = new ArrayList<>();
        for (Component c : start.components()) {
            if (keep.contains(c.designator())) {
                continue;
            }
            if (c.kind() == ComponentKind.INDUCTOR) {
                inductors.add(c.designator());
                keep.add(c.designator());
            } else {
                free.add(c.designator());
            }
        }
        return new FitPlan(new ArrayList<>(keep), free, inductors);
    }

    /**
     * The refit of an existing design keeps its own gain at 1 kHz: |H(1 kHz)| in dB, clamped to
     * ±200 dB (the range {@link GainHold} accepts).
     */
    public static Optional<GainHold> ownGain(Design design) {
        double own = 20 * Math.log10(CircuitModel.of(design, design.name()).response(1000).abs());
        return Optional.of(new GainHold(Math.max(-200, Math.min(200, own)), 1000));
    }
}
