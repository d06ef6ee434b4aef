package org.roseate.circuit;

import java.util.ArrayList;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import org.roseate.value.Tolerance;

/**
 * A complete design: stages cascaded in order (the output of one drives the next through an
 * ideal buffer, i.e. stages do not load each other), plus optional tolerances per component kind
 * letter ({@code "R"}) or per designator ({@code "C3"}); a designator's own entry wins.
 * Immutable; edits return new designs.
 *
 * @param source       the noise voltage that drives the first stage, if the file gives one
 *                     ({@code "source"})
 * @param temperatureC the circuit's temperature for resistor thermal noise, °C, finite and above
 *                     −273.15 ({@code "temperatureC"}, default {@value #DEFAULT_TEMPERATURE_C})
 */
public record Design(String name, String description, List<Stage> stages, Map<String, Tolerance> tolerances,
        Optional<SourceNoise> source, double temperatureC) {
    /** The temperature when the file gives none, °C (the usual room temperature of data sheets). */
    public static final double DEFAULT_TEMPERATURE_C = 25;

    /** A design without a source, at {@value #DEFAULT_TEMPERATURE_C} °C. */
    public Design(String name, String description, List<Stage> stages, Map<String, Tolerance> tolerances) {
        this(name, description, stages, tolerances, Optional.empty(), DEFAULT_TEMPERATURE_C);
    }

    public Design {
        java.util.Objects.requireNonNull(source, "source");
        if (!(temperatureC > -273.15) || !Double.isFinite(temperatureC)) {
            throw new IllegalArgumentException("temperatureC=" + temperatureC + " must be finite and above -273.15");
        }
        stages = List.copyOf(stages);
        tolerances = Collections.unmodifiableMap(new LinkedHashMap<>(tolerances));
        if (stages.isEmpty()) {
            throw new IllegalArgumentException("a design needs at least one stage");
        }
        Map<String, Integer> seen = new LinkedHashMap<>();
        for (Component c : componentsOf(stages)) {
            if (seen.put(c.designator(), 1) != null) {
                throw new IllegalArgumentException("designator " + c.designator() + " is used twice");
            }
        }
    }

    private static List<Component> componentsOf(List<Stage> stages) {
        List<Component> list = new ArrayList<>();
        for (Stage s : stages) {
            s.networks().values().forEach(n -> n.forEachComponent(list::add));
        }
        return list;
    }

    /** All components, in stage and file order. */
    public List<Component> components() {
        return componentsOf(stages);
    }

    public Optional<Component> component(String designator) {
        return components().stream().filter(c -> c.designator().equals(designator)).findFirst();
    }

    /** The tolerance of a component: its own entry, else its kind letter's, else empty. */
    public Optional<Tolerance> toleranceOf(Component c) {
        Tolerance t = tolerances.get(c.designator());
        if (t == null) {
            t = tolerances.get(String.valueOf(c.kind().letter()));
        }
        return Optional.ofNullable(t);
    }

    /** A copy with some component values replaced (Ω, F, H by designator). */
    public Design withValues(Map<String, Double> valuesByDesignator) {
        List<Stage> edited = stages.stream().map(s -> s.mapNetworks(n -> n.withValues(valuesByDesignator))).toList();
        return new Design(name, description, edited, tolerances, source, temperatureC);
    }

    public Design withValue(String designator, double value) {
        return withValues(Map.of(designator, value));
    }

    public Design withName(String newName, String newDescription) {
        return new Design(newName, newDescription, stages, tolerances, source, temperatureC);
    }

    /** A copy with another source (empty: none) and temperature, °C. */
    public Design withSource(Optional<SourceNoise> newSource, double newTemperatureC) {
        return new Design(name, description, stages, tolerances, newSource, newTemperatureC);
    }
}
