package org.roseate.budget;

import java.util.List;
import java.util.Optional;

/**
 * A noise budget over one frequency range: every figure in volts, at the design's output unless
 * said otherwise. RMS values are √∫S df over the range; rates √∫(2πf)²S df.
 *
 * @param loHz              lower end of the range, Hz
 * @param hiHz              upper end of the range, Hz
 * @param temperatureC      the circuit's temperature, °C
 * @param hasSource         false when the design gives no {@code source} (then only the circuit's own noise)
 * @param outputRmsV        total RMS at the output, V
 * @param sourceRmsV        the source's part, V (0 without a source)
 * @param selfNoiseRmsV     the circuit's own part (resistors and op-amps), V
 * @param rateRmsVPerS      RMS rate of change of the output, V/s
 * @param zeroCrossingsPerS Rice's expected zero-crossing rate of the output, 1/s
 * @param outputDensity     the output density at the requested points
 * @param bands             band levels of the output, dBV
 * @param stages            one reading per watched node (each stage's output, then its other op-amp outputs)
 * @param contributors      every contributor's RMS at the output, largest first
 * @param quadratureNodes   number of frequencies the range integrals used
 */
public record BudgetResult(double loHz, double hiHz, double temperatureC, boolean hasSource, double outputRmsV,
        double sourceRmsV, double selfNoiseRmsV, double rateRmsVPerS, double zeroCrossingsPerS,
        List<DensityPoint> outputDensity, List<BandLevel> bands, List<StageReading> stages,
        List<Contributor> contributors, int quadratureNodes) {

    public BudgetResult {
        outputDensity = List.copyOf(outputDensity);
        bands = List.copyOf(bands);
        stages = List.copyOf(stages);
        contributors = List.copyOf(contributors);
    }

    /** 20·log10(source/self), dB; empty without a source or without self noise. */
    public Optional<Double> sourceToSelfDb() {
        return hasSource && selfNoiseRmsV > 0 ? Optional.of(20 * Math.log10(sourceRmsV / selfNoiseRmsV)) : Optional.empty();
    }

    /** The output density at one frequency: V/√Hz. */
    public record DensityPoint(double hz, double vPerRtHz) {
    }

    /** One band's output power as 10·log10(∫S df / 1 V²), dBV. */
    public record BandLevel(double nominalHz, double lowHz, double highHz, double dbv) {
    }

    /** One contributor's RMS at the output over the range, V. */
    public record Contributor(String name, double rmsV) {
    }

    /**
     * The signal at one stage's output (or one of its op-amps' outputs).
     *
     * @param stage          1-based stage number
     * @param node           the node's name in the stage's circuit form ({@code out} for the older kinds)
     * @param opamp          the op-amp driving the node, if any
     * @param rmsV           RMS over the range, V
     * @param swingV         the op-amp's peak swing, V, if given
     * @param slewRmsVPerUs  RMS rate of change, V/µs
     * @param slewVPerUs     the op-amp's slew rate, V/µs, if given
     */
    public record StageReading(int stage, String node, Optional<String> opamp, double rmsV, Optional<Double> swingV,
            double slewRmsVPerUs, Optional<Double> slewVPerUs) {

        /** 20·log10(swing / RMS), dB: how far the RMS sits below the rails' reach; empty when RMS is 0. */
        public Optional<Double> headroomDb() {
            return swingV.filter(s -> rmsV > 0).map(s -> 20 * Math.log10(s / rmsV));
        }

        /** P(|v| &gt; swing) for a Gaussian voltage of this RMS: erfc(swing/(√2·RMS)). */
        public Optional<Double> clipProbability() {
            return swingV.map(s -> Gaussian.exceedanceProbability(s, rmsV));
        }

        /** 4σ rate of change, V/µs: exceeded about 6e-5 of the time by a Gaussian rate. */
        public double slew4SigmaVPerUs() {
            return 4 * slewRmsVPerUs;
        }
    }
}
