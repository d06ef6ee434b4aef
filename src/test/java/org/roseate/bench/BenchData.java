package org.roseate.bench;

import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.channels.FileChannel;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.SplittableRandom;
import org.roseate.circuit.DesignReader;
import org.roseate.digital.Biquad;
import org.roseate.digital.SosDesign;
import org.roseate.model.CircuitModel;
import org.roseate.model.Zpk;
import org.roseate.noise.ChainSettings;
import org.roseate.noise.NoiseChain;

/**
 * The data shared by the JMH benchmarks and {@code src/test/bench/compare_with_scipy.py}, made once
 * so both time the same work: a seeded white signal (float64, little-endian, {@link #SIGNAL_SAMPLES}
 * samples) and the second-order sections of {@link #EIGHT_SECTION_DESIGN} as the chain runs them
 * (b0 b1 b2 1 a1 a2 per line, scipy's sos layout).
 *
 * <p>{@code java -cp … org.roseate.bench.BenchData DIR} writes {@code DIR/signal.f64},
 * {@code DIR/sos.txt} and {@code DIR/settings.txt}.
 */
public final class BenchData {
    /** 2^20 samples: large enough to time, small enough to stay in a cache-friendly few MB. */
    public static final int SIGNAL_SAMPLES = 1 << 20;
    public static final long SIGNAL_SEED = 20240611L;
    /** Welch settings of the comparison: Hann, 50 % overlap, constant detrend, mean (scipy's defaults). */
    public static final int WELCH_SEGMENT = 8192;
    public static final double RATE_HZ = 48000;

    /**
     * Two pink stages and a gentle low-pass: 8 second-order sections at the chain's oversampled
     * rate, the size named by the performance target (our own values, as the presets).
     */
    public static final String EIGHT_SECTION_DESIGN = """
            {"name": "Eight-section bench chain", "stages": [
              {"kind": "inverting", "input": "R1(33k)",
               "feedback": "R2(360k) || C1(680p) || (R3(220k) + C2(18n)) || (R4(100k) + C3(5n6)) || (R5(43k) + C4(2n2)) || (R6(13k) + C5(1n)) || (R7(560k) + C6(270p))",
               "opamp": {"gbwHz": 10e6}},
              {"kind": "inverting", "input": "R11(47k)",
               "feedback": "R12(240k) || C11(1n) || (R13(150k) + C12(12n)) || (R14(56k) + C13(3n9)) || (R15(20k) + C14(1n5))",
               "opamp": {"gbwHz": 3e6}},
              {"kind": "divider", "series": "R21(1k)", "shunt": "C21(2n2)"},
              {"kind": "noninverting", "ground": "R31(10k)", "feedback": "R32(10k) || C31(330p)", "opamp": {"gbwHz": 3e6}}
            ]}
            """;

    private BenchData() {
    }

    public static Zpk eightSectionZpk() {
        return CircuitModel.of(DesignReader.parse(EIGHT_SECTION_DESIGN, "eight.json"), "eight.json").zpk();
    }

    /** The chain of {@link #EIGHT_SECTION_DESIGN} at 48 kHz stereo, -20 dBFS. */
    public static NoiseChain eightSectionChain() {
        return NoiseChain.design(eightSectionZpk(), new ChainSettings(RATE_HZ, 2, false, 1, -20), "eight");
    }

    /** The sections the chain runs (at its oversampled rate). */
    public static SosDesign eightSections() {
        return eightSectionChain().filter().orElseThrow().sections();
    }

    public static double[] signal() {
        SplittableRandom r = new SplittableRandom(SIGNAL_SEED);
        double[] x = new double[SIGNAL_SAMPLES];
        for (int i = 0; i < x.length; i++) {
            x[i] = r.nextDouble(-1, 1);
        }
        return x;
    }

    /** Reads a signal written by {@link #main}; falls back to {@link #signal()} when the file is absent. */
    public static double[] signal(Path dir) throws IOException {
        Path f = dir.resolve("signal.f64");
        if (!Files.exists(f)) {
            return signal();
        }
        ByteBuffer b = ByteBuffer.wrap(Files.readAllBytes(f)).order(ByteOrder.LITTLE_ENDIAN);
        double[] x = new double[b.remaining() / 8];
        b.asDoubleBuffer().get(x);
        return x;
    }

    /**
     * The sections of {@code presets/bench-pink.json} as {@code render} runs them at 48 kHz mono
     * (at the oversampled rate), for the whole-process render job of {@code whole_process_jobs.py}:
     * {@code DIR/bench-pink-sos.txt} (scipy's sos layout) and {@code DIR/bench-pink.txt}
     * ({@code factor=M}, {@code sos_rate_hz=…}).
     */
    static void writeBenchPinkSections(Path dir) throws IOException {
        Zpk zpk = CircuitModel.of(DesignReader.read(Path.of("presets/bench-pink.json")), "bench-pink.json").zpk();
        NoiseChain chain = NoiseChain.design(zpk, new ChainSettings(RATE_HZ, 1, false, 1, -20), "bench-pink");
        SosDesign sos = chain.filter().orElseThrow().sections();
        List<String> lines = new ArrayList<>();
        for (Biquad q : sos.sections()) {
            lines.add(String.format(Locale.ROOT, "%.17g %.17g %.17g 1 %.17g %.17g", q.b0(), q.b1(), q.b2(), q.a1(), q.a2()));
        }
        Files.write(dir.resolve("bench-pink-sos.txt"), lines, StandardCharsets.UTF_8);
        Files.writeString(dir.resolve("bench-pink.txt"), String.format(Locale.ROOT, "factor=%d%nsos_rate_hz=%s%n",
                chain.oversamplingFactor(), sos.sampleRateHz()));
    }

    public static void main(String[] args) throws IOException {
        Path dir = Path.of(args.length > 0 ? args[0] : "target/bench-data");
        Files.createDirectories(dir);
        double[] x = signal();
        ByteBuffer b = ByteBuffer.allocate(8 * x.length).order(ByteOrder.LITTLE_ENDIAN);
        b.asDoubleBuffer().put(x);
        try (FileChannel ch = FileChannel.open(dir.resolve("signal.f64"), StandardOpenOption.CREATE,
                StandardOpenOption.TRUNCATE_EXISTING, StandardOpenOption.WRITE)) {
            ch.write(b);
        }
        SosDesign sos = eightSections();
        List<String> lines = new ArrayList<>();
        for (Biquad q : sos.sections()) {
            lines.add(String.format(Locale.ROOT, "%.17g %.17g %.17g 1 %.17g %.17g", q.b0(), q.b1(), q.b2(), q.a1(), q.a2()));
        }
        Files.write(dir.resolve("sos.txt"), lines, StandardCharsets.UTF_8);
        Files.writeString(dir.resolve("settings.txt"), String.format(Locale.ROOT,
                "rate_hz=%s%nsos_rate_hz=%s%nwelch_segment=%d%nwelch_overlap=%d%nsections=%d%nsamples=%d%n",
                RATE_HZ, sos.sampleRateHz(), WELCH_SEGMENT, WELCH_SEGMENT / 2, sos.sections().size(), x.length));
        writeBenchPinkSections(dir);
        System.out.println("wrote " + dir + ": " + x.length + " samples, " + sos.sections().size() + " sections at "
                + sos.sampleRateHz() + " Hz");
    }
}
