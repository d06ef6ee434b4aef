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
import org.roseate.circuit.Design;
import org.roseate.circuit.DesignReader;
import org.roseate.model.CircuitModel;

/**
 * Issue 11, speed: the exact response of a 40-part circuit stage at 2000 log-spaced frequencies
 * (what the window recomputes on every edit). The circuit: nine unbuffered ladder sections
 * (series R into R ‖ (R + C) to ground, four parts each) into a unity-gain follower low-pass with
 * a 1 MHz op-amp; 13 nodes and one op-amp, so one 13×13 complex LU per frequency. Score: ms per
 * whole response; target &lt; 5 ms warm.
 */
@State(Scope.Thread)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Warmup(iterations = 3, time = 1)
@Measurement(iterations = 5, time = 1)
@Fork(1)
public class CircuitResponseBench {
    private CircuitModel model;
    private double[] hz;
    private double[] re;
    private double[] im;

    /** The 40-part design as design-file text (our own invented values). */
    static String fortyPartDesign() {
        StringBuilder b = new StringBuilder("{\"name\": \"forty parts\", \"stages\": [{\"kind\": \"circuit\", \"input\": \"n0\", \"output\": \"out\", \"branches\": {");
        int r = 1;
        int c = 1;
        for (int k = 0; k < 9; k++) {
            double scale = Math.pow(2.2, k);
            b.append(String.format(java.util.Locale.ROOT, "\"n%d n%d\": \"R%d(%.4g)\", \"n%d gnd\": \"R%d(%.4g) || (R%d(%.4g) + C%d(%.4g))\", ",
                    k, k + 1, r, 1e3 * scale, k + 1, r + 1, 47e3 * scale, r + 2, 4.7e3 * scale, c, 47e-9 / scale));
            r += 3;
            c++;
        }
        b.append(String.format(java.util.Locale.ROOT, "\"n9 a\": \"R%d(10k)\", \"a b\": \"R%d(10k)\", \"a out\": \"C%d(22n)\", \"b gnd\": \"C%d(10n)\"}, ",
                r, r + 1, c, c + 1));
        b.append("\"opamps\": {\"U1\": {\"plus\": \"b\", \"minus\": \"out\", \"output\": \"out\", \"gbwHz\": 1e6}}}]}");
        return b.toString();
    }

    @Setup
    public void setup() {
        Design d = DesignReader.parse(fortyPartDesign(), "forty.json");
        if (d.components().size() != 40) {
            throw new IllegalStateException("expected 40 parts, got " + d.components().size());
        }
        model = CircuitModel.of(d, "forty.json");
        hz = new double[2000];
        for (int i = 0; i < hz.length; i++) {
            hz[i] = 10 * Math.pow(1e4, i / (hz.length - 1.0));
        }
        re = new double[hz.length];
        im = new double[hz.length];
    }

    @Benchmark
    public double[] response() {
        model.response(hz, re, im);
        return re;
    }
}
