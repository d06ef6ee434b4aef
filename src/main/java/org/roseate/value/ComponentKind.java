package org.roseate.value;

import java.util.Optional;

/**
 * The three passive component kinds a noise-shaping network is built from, each with its
 * reference-designator letter and the symbol of its SI unit.
 */
public enum ComponentKind {
    /** Resistance in ohms (Ω). */
    RESISTOR('R', "Ω", "resistor"),
    /** Capacitance in farads (F). */
    CAPACITOR('C', "F", "capacitor"),
    /** Inductance in henries (H). */
    INDUCTOR('L', "H", "inductor");

    private final char letter;
    private final String unitSymbol;
    private final String noun;

    ComponentKind(char letter, String unitSymbol, String noun) {
        this.letter = letter;
        this.unitSymbol = unitSymbol;
        this.noun = noun;
    }

    /** The reference-designator letter: R, C or L (common practice, e.g. "R12", "C3"). */
    public char letter() {
        return letter;
    }

    /** The SI unit symbol: "Ω" (U+03A9), "F" or "H". */
    public String unitSymbol() {
        return unitSymbol;
    }

    /** "a" or "an", to go before {@link #noun()}. */
    String article() {
        return this == INDUCTOR ? "an" : "a";
    }

    /** The plain English name, lower case ("resistor"), for messages. */
    String noun() {
        return noun;
    }

    /**
     * The kind whose designator letter is {@code c}, ignoring case ('r' and 'R' both give
     * {@link #RESISTOR}); empty for any other character.
     */
    public static Optional<ComponentKind> ofLetter(char c) {
        char upper = Character.toUpperCase(c);
        for (ComponentKind k : values()) {
            if (k.letter == upper) {
                return Optional.of(k);
            }
        }
        return Optional.empty();
    }
}
