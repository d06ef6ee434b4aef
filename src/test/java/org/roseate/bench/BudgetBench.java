package org.roseate.bench;

import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Warmup;
import org.roseate.bands.BandFraction;
import org.roseate.budget.BudgetResult;
import org.roseate.budget.NoiseBudget;
import org.roseate.budget.Quadrature;
import org.roseate.circuit.Design;
import org.roseate.circuit.DesignReader;

/**
 * Issue 13, speed: the noise budget of a 40-part, 3-op-amp design (a five-section unbuffered RC
 * ladder into a follower, an inverting stage, a noninverting stage; every resistor and op-amp a
 * noise contributor) over 20 Hz – 20 kHz: the range integrals on the {@link Quadrature} grid
 * (2216 frequencies), 31 third-octave band levels and 31 density points. Score: ms per whole
 * budget; target &lt; 50 ms warm.
 */
@State(Scope.Thread)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Warmup(iterations = 3, time = 1)
@Measurement(iterations = 5, time = 1)
@Fork(1)
public class BudgetBench {
    private NoiseBudget budget;
    private double[] points;

    /** The 40-part design as design-file text (our own invented values). */
    public static String fortyPartThreeOpampDesign() {
        StringBuilder b = new StringBuilder("{\"name\": \"forty parts, three op-amps\", "
                + "\"source\": {\"densityVPerRtHz\": 150e-6, \"flickerCornerHz\": 250}, \"stages\": ["
                + "{\"kind\": \"circuit\", \"input\": \"n0\", \"output\": \"out\", \"branches\": {");
        int r = 1;
        int c = 1;
        for (int s = 0; s < 5; s++) {
            b.append(String.format("\"n%d n%d\": \"R%d(%dk)\", ", s, s + 1, r++, 2 + 3 * s));
            b.append(String.format("\"n%d gnd\": \"R%d(%dk) || (R%d(%dk) + C%d(%dn))\"%s", s + 1, r, 47 + 10 * s, r + 1, 4 + s, c++,
                    100 / (s + 1), s < 4 ? ", " : ""));
            r += 2;
        }
        b.append("}, \"opamps\": {\"U1\": {\"plus\": \"n5\", \"minus\": \"out\", \"output\": \"out\", \"gbwHz\": 3e6, "
                + "\"enVPerRtHz\": 5e-9, \"inAPerRtHz\": 1e-12, \"enCornerHz\": 30, \"swingV\": 12, \"slewVPerUs\": 13}}}, ");
        b.append(String.format("{\"kind\": \"inverting\", \"input\": \"R%d(10k)\", \"feedback\": \"R%d(100k) || (R%d(33k) + C%d(22n)) "
                + "|| (R%d(8k2) + C%d(6n8)) || (R%d(2k2) + C%d(2n2))\", \"opamp\": {\"gbwHz\": 1e6, \"enVPerRtHz\": 18e-9, "
                + "\"inAPerRtHz\": 1e-14, \"swingV\": 13, \"slewVPerUs\": 13}}, ", r, r + 1, r + 2, c, r + 3, c + 1, r + 4, c + 2));
        r += 5;
        c += 3;
        b.append(String.format("{\"kind\": \"noninverting\", \"ground\": \"R%d(2k2) + C%d(10u)\", \"feedback\": \"R%d(100k) || "
                + "(R%d(47k) + C%d(1n)) || (R%d(22k) + C%d(2n2)) || (R%d(10k) + C%d(4n7)) || (R%d(4k7) + C%d(10n)) || C%d(100p)\", "
                + "\"opamp\": {\"gbwHz\": 1e6, \"enVPerRtHz\": 8e-9, \"inAPerRtHz\": 2e-13, \"swingV\": 10, \"slewVPerUs\": 0.5}}]}",
                r, c, r + 1, r + 2, c + 1, r + 3, c + 2, r + 4, c + 3, r + 5, c + 4, c + 5));
        return b.toString();
    }

    @Setup
    public void setup() {
        Design d = DesignReader.parse(fortyPartThreeOpampDesign(), "bench");
        if (d.components().size() != 40) {
            throw new IllegalStateException("expected 40 parts, got " + d.components().size());
        }
        budget = NoiseBudget.of(d, "bench");
        points = org.roseate.compare.LogGrid.points(20, 20000, 10);
    }

    @Benchmark
    public BudgetResult budget() {
        return budget.compute(20, 20000, points, BandFraction.THIRD_OCTAVE);
    }
}
