package org.roseate.compare;

/**
 * A target spectral slope in dB per octave for the noise power density: pink is
 * −10·log10(2) ≈ −3.0103 dB/octave (density ∝ 1/f), white 0, brown −20·log10(2) ≈ −6.0206
 * (∝ 1/f²), blue +3.0103. Equivalently a power law: density ∝ f^γ with
 * γ = dbPerOctave / (10·log10 2).
 *
 * @param dbPerOctave finite, within ±24 dB/octave
 */
public record TargetSlope(double dbPerOctave) {
    /** 10·log10(2) dB: one octave of a 1/f density. */
    public static final double DB_PER_OCTAVE_OF_1_OVER_F = 10 * Math.log10(2);
    public static final TargetSlope PINK = new TargetSlope(-DB_PER_OCTAVE_OF_1_OVER_F);
    public static final TargetSlope WHITE = new TargetSlope(0);
    public static final TargetSlope BROWN = new TargetSlope(-2 * DB_PER_OCTAVE_OF_1_OVER_F);
    public static final TargetSlope BLUE = new TargetSlope(DB_PER_OCTAVE_OF_1_OVER_F);

    /** Reference frequency of the target line, Hz: the line passes 0 dB here. */
    public static final double REFERENCE_HZ = 1000;

    public TargetSlope {
        if (!Double.isFinite(dbPerOctave) || Math.abs(dbPerOctave) > 24) {
            throw new IllegalArgumentException("slope=" + dbPerOctave + " dB/octave must be finite and within ±24");
        }
    }

    /** The exponent γ of the density power law f^γ. */
    public double exponent() {
        return dbPerOctave / DB_PER_OCTAVE_OF_1_OVER_F;
    }

    /** The target line at {@code hz}: dbPerOctave · log2(hz/1000), in dB. */
    public double levelDb(double hz) {
        return dbPerOctave * Math.log(hz / REFERENCE_HZ) / Math.log(2);
    }

    /**
     * Power of the target density (f/1000)^γ between two frequencies, in Hz-weighted units:
     * ∫ (f/1000)^γ df = 1000·[u^(γ+1)/(γ+1)] from u = low/1000 to high/1000, or 1000·ln(high/low)
     * for γ = −1 (closed form).
     */
    public double bandPower(double lowHz, double highHz) {
        double g = exponent();
        double ul = lowHz / REFERENCE_HZ;
        double uh = highHz / REFERENCE_HZ;
        if (Math.abs(g + 1) < 1e-12) {
            return REFERENCE_HZ * Math.log(uh / ul);
        }
        return REFERENCE_HZ * (Math.pow(uh, g + 1) - Math.pow(ul, g + 1)) / (g + 1);
    }

    /** A readable name: "pink", "white", "brown", "blue" for those slopes, else the number. */
    public String describe() {
        if (this.equals(PINK)) {
            return "pink (" + String.format(java.util.Locale.ROOT, "%.2f", dbPerOctave) + " dB/octave)";
        }
        if (this.equals(WHITE)) {
            return "white (0 dB/octave)";
        }
        if (this.equals(BROWN)) {
            return "brown (−6.02 dB/octave)";
        }
        if (this.equals(BLUE)) {
            return "blue (+3.01 dB/octave)";
        }
        return String.format(java.util.Locale.ROOT, "%+.2f dB/octave", dbPerOctave);
    }

    /** Parses "pink", "white", "brown", "blue" or a number of dB/octave such as "-3.01". */
    public static TargetSlope parse(String text) {
        String t = text.trim().toLowerCase(java.util.Locale.ROOT);
        switch (t) {
            case "pink":
                return PINK;
            case "white":
                return WHITE;
            case "brown":
            case "red":
                return BROWN;
            case "blue":
                return BLUE;
            default:
                break;
        }
        double v;
        try {
            v = Double.parseDouble(t.replace("db/octave", "").replace("db/oct", "").replace("db", "").trim());
        } catch (NumberFormatException e) {
            throw new IllegalArgumentException("expected a slope in dB/octave such as -3.01, or pink, white, brown, blue; found '" + text + "'");
        }
        return new TargetSlope(v);
    }
}
