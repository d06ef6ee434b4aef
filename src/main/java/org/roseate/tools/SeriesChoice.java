package org.roseate.tools;

import java.util.Objects;
import org.roseate.value.ComponentKind;
import org.roseate.value.ESeries;

/**
 * Which IEC 60063 series the fitter snaps each kind to.
 *
 * @param resistors  series for resistors
 * @param capacitors series for capacitors
 */
public record SeriesChoice(ESeries resistors, ESeries capacitors) {
    public SeriesChoice {
        Objects.requireNonNull(resistors, "resistors");
        Objects.requireNonNull(capacitors, "capacitors");
    }

    /** The same series for both kinds. */
    public static SeriesChoice of(ESeries both) {
        return new SeriesChoice(both, both);
    }

    /** The series for a kind; the fitter handles R and C only. */
    public ESeries of(ComponentKind kind) {
        return switch (kind) {
            case RESISTOR -> resistors;
            case CAPACITOR -> capacitors;
            default -> throw new IllegalArgumentException("no series for " + kind + ": the fitter handles R and C");
        };
    }
}
