package org.roseate.budget;

/**
 * Thermal (Johnson–Nyquist) noise of resistors: the open-circuit voltage density of a resistance R
 * at absolute temperature T is 4·k·T·R in V²/Hz (Nyquist, "Thermal agitation of electric charge in
 * conductors", Phys. Rev. 32, 110, 1928), flat at audio frequencies (the quantum correction is
 * below 1e-9 there).
 */
public final class Thermal {
    /** The Boltzmann constant, J/K, exact in the SI since 2019 (BIPM, SI Brochure, 9th edition). */
    public static final double BOLTZMANN_J_PER_K = 1.380649e-23;
    /** 0 °C in kelvin, exact by the definition of the Celsius scale. */
    public static final double ZERO_CELSIUS_K = 273.15;

    private Thermal() {
    }

    /** Absolute temperature in K for a temperature in °C. */
    public static double kelvin(double temperatureC) {
        return temperatureC + ZERO_CELSIUS_K;
    }

    /** 4kT in J (= V²/(Hz·Ω)) at {@code temperatureC} °C. */
    public static double fourKt(double temperatureC) {
        return 4 * BOLTZMANN_J_PER_K * kelvin(temperatureC);
    }

    /** √(4kTR), the thermal noise density of {@code ohms} at {@code temperatureC}, V/√Hz. */
    public static double resistorDensityVPerRtHz(double ohms, double temperatureC) {
        return Math.sqrt(fourKt(temperatureC) * ohms);
    }
}
