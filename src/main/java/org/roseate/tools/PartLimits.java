package org.roseate.tools;

import java.util.Locale;
import org.roseate.value.ComponentKind;
import org.roseate.value.EngineeringValue;

/**
 * The value range the fitter may use per component kind: resistors in Ω, capacitors in F.
 * The default, 1 kΩ–2.2 MΩ and 100 pF–1 µF, keeps an op-amp network away from loading its
 * driver and from leakage and stray capacitance (common practice).
 *
 * @param minOhms   smallest resistor, Ω, finite, &gt; 0
 * @param maxOhms   largest resistor, Ω, &gt; minOhms
 * @param minFarads smallest capacitor, F, finite, &gt; 0
 * @param maxFarads largest capacitor, F, &gt; minFarads
 */
public record PartLimits(double minOhms, double maxOhms, double minFarads, double maxFarads) {
    public static final PartLimits DEFAULT = new PartLimits(1e3, 2.2e6, 100e-12, 1e-6);

    public PartLimits {
        check("R", minOhms, maxOhms);
        check("C", minFarads, maxFarads);
    }

    private static void check(String kind, double lo, double hi) {
        if (!(lo > 0) || !Double.isFinite(hi) || !(hi > lo)) {
            throw new IllegalArgumentException("limits " + kind + "=" + lo + "-" + hi + " must satisfy 0 < low < high");
        }
    }

    /** The lower limit for a kind (Ω or F). */
    public double min(ComponentKind kind) {
        return switch (kind) {
            case RESISTOR -> minOhms;
            case CAPACITOR -> minFarads;
            default -> throw new IllegalArgumentException("no limits for " + kind + ": the fitter handles R and C");
        };
    }

    /** The upper limit for a kind (Ω or F). */
    public double max(ComponentKind kind) {
        return switch (kind) {
            case RESISTOR -> maxOhms;
            case CAPACITOR -> maxFarads;
            default -> throw new IllegalArgumentException("no limits for " + kind + ": the fitter handles R and C");
        };
    }

    /**
     * Reads "R=1k-2M2,C=100p-1u" (either part may be left out and keeps the default), values in
     * IEC 60062 letter code or SI prefixes.
     *
     * @throws IllegalArgumentException quoting the text when it does not read
     */
    public static PartLimits parse(String text) {
        double[] r = {DEFAULT.minOhms, DEFAULT.maxOhms};
        double[] c = {DEFAULT.minFarads, DEFAULT.maxFarads};
        for (String item : text.split(",")) {
            String t = item.trim();
            int eq = t.indexOf('=');
            int dash = t.indexOf('-', eq + 2);
            if (eq != 1 || dash < 0) {
                throw new IllegalArgumentException("expected limits such as R=1k-2M2,C=100p-1u, found '" + text + "'");
            }
            char letter = Character.toUpperCase(t.charAt(0));
            ComponentKind kind = switch (letter) {
                case 'R' -> ComponentKind.RESISTOR;
                case 'C' -> ComponentKind.CAPACITOR;
                default -> throw new IllegalArgumentException("limits: expected R or C before '=', found '" + item.trim() + "'");
            };
            double lo;
            double hi;
            try {
                lo = EngineeringValue.parse(t.substring(2, dash).trim(), kind);
                hi = EngineeringValue.parse(t.substring(dash + 1).trim(), kind);
            } catch (IllegalArgumentException e) {
                throw new IllegalArgumentException("limits '" + item.trim() + "': " + e.getMessage());
            }
            if (!(hi > lo)) {
                throw new IllegalArgumentException("limits '" + item.trim() + "': the low value must be below the high one");
            }
            double[] target = letter == 'R' ? r : c;
            target[0] = lo;
            target[1] = hi;
        }
        return new PartLimits(r[0], r[1], c[0], c[1]);
    }

    @Override
    public String toString() {
        return String.format(Locale.ROOT, "R=%s-%s,C=%s-%s",
                EngineeringValue.format(minOhms, ComponentKind.RESISTOR), EngineeringValue.format(maxOhms, ComponentKind.RESISTOR),
                EngineeringValue.format(minFarads, ComponentKind.CAPACITOR), EngineeringValue.format(maxFarads, ComponentKind.CAPACITOR));
    }
}
