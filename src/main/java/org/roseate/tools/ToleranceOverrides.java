package org.roseate.tools;

import java.util.LinkedHashMap;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import java.util.TreeSet;
import org.roseate.circuit.Component;
import org.roseate.circuit.Design;
import org.roseate.value.ComponentKind;
import org.roseate.value.Tolerance;

/**
 * Tolerances given on the command line, "R=1%,C=5%,C3=2%": per kind letter (R, C, L) or per
 * designator, as in a design file's {@code tolerance} map, plus {@value #OPAMP_GBW_KEY} for the
 * gain-bandwidth product (gbwHz) of every op-amp, where the caller allows it. They are laid over
 * the design's own map: a key given here replaces the file's entry of the same key, the file's
 * other entries stay.
 */
public final class ToleranceOverrides {
    /** The key for the spread of every op-amp's gbwHz (the unit of an op-amp's designator). */
    public static final String OPAMP_GBW_KEY = "U";

    private ToleranceOverrides() {
    }

    /**
     * Reads the text against a design.
     *
     * @param allowOpAmp whether the {@value #OPAMP_GBW_KEY} key is accepted
     * @return the entries in the order given
     * @throws IllegalArgumentException naming the bad item
     */
    public static Map<String, Tolerance> parse(String text, Design design, boolean allowOpAmp) {
        Set<String> designators = new TreeSet<>();
        for (Component c : design.components()) {
            designators.add(c.designator());
        }
        Map<String, Tolerance> out = new LinkedHashMap<>();
        for (String item : text.split(",")) {
            String t = item.trim();
            int eq = t.indexOf('=');
            if (eq <= 0 || eq == t.length() - 1) {
                throw new IllegalArgumentException("expected tolerances such as R=1%,C=5%,C3=2%, found '" + text + "'");
            }
            String key = t.substring(0, eq).trim();
            String upper = key.toUpperCase(Locale.ROOT);
            boolean kindKey = upper.length() == 1 && ComponentKind.ofLetter(upper.charAt(0)).isPresent();
            boolean opamp = upper.equals(OPAMP_GBW_KEY);
            if (opamp && !allowOpAmp) {
                throw new IllegalArgumentException("'" + key + "': an op-amp gain-bandwidth tolerance does not belong here");
            }
            if (!kindKey && !opamp && !designators.contains(key)) {
                throw new IllegalArgumentException("unknown key '" + key + "'; expected R, C, L"
                        + (allowOpAmp ? ", " + OPAMP_GBW_KEY + " (op-amp gbwHz)" : "") + " or a designator of this design");
            }
            try {
                out.put(kindKey || opamp ? upper : key, Tolerance.parse(t.substring(eq + 1)));
            } catch (IllegalArgumentException e) {
                throw new IllegalArgumentException("'" + t + "': " + e.getMessage());
            }
        }
        return out;
    }

    /** The design's own map with the given entries laid over it (given keys win). */
    public static Map<String, Tolerance> over(Design design, Map<String, Tolerance> given) {
        Map<String, Tolerance> m = new LinkedHashMap<>(design.tolerances());
        m.putAll(given);
        return m;
    }
}
