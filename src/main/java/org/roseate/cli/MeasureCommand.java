package org.roseate.cli;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.AccessDeniedException;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.Callable;
import org.roseate.bands.BandFraction;
import org.roseate.bands.BandTable;
import org.roseate.compare.BandReading;
import org.roseate.compare.FrequencyRange;
import org.roseate.compare.LogGrid;
import org.roseate.compare.TargetSlope;
import org.roseate.io.WavFormat;
import org.roseate.io.WavFormatException;
import org.roseate.io.WavReader;
import org.roseate.model.CircuitModel;
import org.roseate.spectrum.BandLevel;
import org.roseate.spectrum.BandLevels;
import org.roseate.spectrum.Calibration;
import org.roseate.spectrum.CalibrationException;
import org.roseate.spectrum.CrossSpectrumEstimator;
import org.roseate.spectrum.SpectralDensity;
import org.roseate.spectrum.TransferEstimate;
import org.roseate.spectrum.TransferResult;
import org.roseate.spectrum.NoiseSourceResult;
import org.roseate.spectrum.WelchEstimator;
import org.roseate.spectrum.WelchSettings;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code measure FILE.wav}: band levels of a captured noise source, or the transfer function of a circuit. */
@Command(name = "measure", mixinStandardHelpOptions = true,
        description = "Measure a built circuit from a WAV capture: band levels of a noise source (one channel), "
                + "or with --transfer the response between a reference and a response channel.")
final class MeasureCommand implements Callable<Integer> {
    static final String NOISE_LEGEND = "Band level: the Welch density (Hann, 50% overlap) integrated between the "
            + "IEC 61260-1 band edges; a full-scale sine reads 0 dBFS. ±: one standard deviation of the random "
            + "error, 10·log10(1 + 1/√(B·T_eff)). Deviation: against the target slope's band levels, centred.";
    static final String TRANSFER_LEGEND = "Band level: 10·log10 ∫|H|² df over the band, as analyze reports for a "
            + "design. H = Gxy/Gxx (H1); coherence γ² = |Gxy|²/(Gxx·Gyy); points with γ² below "
            + TransferResult.DEFAULT_COHERENCE_THRESHOLD + " are marked untrusted (*).";
    private static final int BLOCK_FRAMES = 8192;
    private static final int MIN_SEGMENT = 16;

    enum Format { table, json, csv }

    @picocli.CommandLine.Mixin
    BandOptions bandOptions = new BandOptions();

    @Parameters(index = "0", arity = "0..1", paramLabel = "FILE.wav", description = "the capture (or --live)")
    Path file;

    @Option(names = "--live", description = "record from line-in first (then analyse the recording)")
    boolean live;

    @Option(names = "--device", paramLabel = "NAME|INDEX", description = "with --live: input device (default: the system's)")
    String device;

    @Option(names = "--output-device", paramLabel = "NAME|INDEX", description = "with --live --transfer: output device for the test noise")
    String outputDevice;

    @Option(names = "--rate", defaultValue = "48000", description = "with --live: sample rate in Hz (default: ${DEFAULT-VALUE})")
    int rateHz;

    @Option(names = "--seconds", defaultValue = "10", description = "with --live: recording length (default: ${DEFAULT-VALUE})")
    double seconds;

    @Option(names = "--level", defaultValue = "-20", paramLabel = "DBFS",
            description = "with --live --transfer: RMS level of the white test noise (default: ${DEFAULT-VALUE}; above -10 needs --allow-loud)")
    double levelDbfs;

    @Option(names = "--allow-loud", description = "allow a test-noise level above -10 dBFS")
    boolean allowLoud;

    @Option(names = "--save-capture", paramLabel = "OUT.wav", description = "with --live: keep the raw recording")
    Path saveCapture;

    @Option(names = "--force", description = "replace an existing --save-capture or --plot file")
    boolean force;

    @Option(names = "--plot", paramLabel = "FILE.png|FILE.svg", description = "noise-source mode: draw the bands with their uncertainty")
    Path plot;

    @Option(names = "--channel", paramLabel = "N", description = "channel to measure, from 1 (default 1); with --transfer the response channel")
    Integer channel;

    @Option(names = "--transfer", description = "two-channel transfer measurement")
    boolean transfer;

    @Option(names = "--reference-channel", paramLabel = "N", description = "with --transfer: the reference channel, from 1 (default 1)")
    Integer referenceChannel;

    @Option(names = "--against", paramLabel = "DESIGN.json", description = "compare with a design's predicted levels")
    Path against;

    @Option(names = "--calibration", paramLabel = "cal.json", description = "divide out a loopback calibration (and use its volts per full scale)")
    Path calibration;

    @Option(names = "--save-calibration", paramLabel = "cal.json", description = "with --transfer on a loopback capture: save it as a calibration")
    Path saveCalibration;

    @Option(names = "--volts-per-fs", paramLabel = "V", description = "volts peak at input full scale: levels in dBV")
    Double voltsPerFs;

    @Option(names = "--segment", paramLabel = "N", description = "FFT segment length (default: the smallest power of two giving the lowest band 8 bins)")
    Integer segment;

    @Option(names = "--format", defaultValue = "table", description = "table, json or csv (default: ${DEFAULT-VALUE})")
    Format format;

    @Option(names = "--freqs", paramLabel = "F1,F2,…", description = "with --transfer: response points in Hz (default: a log grid, 20 per decade)")
    String freqs;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    private String name() {
        return file.toString();
    }

    @Override
    public Integer call() {
        if (live) {
            if (file != null) {
                throw new UserInputException("measure: give a WAV file or --live, not both");
            }
            file = LiveCapture.record(this);
        } else if (file == null) {
            throw new UserInputException("measure: name a WAV file, or record one with --live");
        } else if (saveCapture != null) {
            throw new UserInputException("--save-capture applies to --live only");
        }
        try {
            return analyse();
        } finally {
            if (live && saveCapture == null) {
                try {
                    Files.deleteIfExists(file);
                } catch (IOException e) {
                    spec.commandLine().getErr().println("roseate: note: could not delete the temporary capture " + file);
                }
            }
        }
    }

    private Integer analyse() {
        CompareCommand.checkPlotName(plot);
        if (plot != null && transfer) {
            throw new UserInputException("--plot draws noise-source measurements; leave out --transfer");
        }
        FrequencyRange r = bandOptions.range();
        TargetSlope target = bandOptions.target();
        BandFraction fraction = bandOptions.fraction();
        BandTable table;
        try {
            table = BandTable.of(fraction, r.loHz(), r.hiHz());
        } catch (IllegalArgumentException e) {
            throw new UserInputException("--range: " + e.getMessage());
        }
        if (!transfer && saveCalibration != null) {
            throw new UserInputException("--save-calibration needs --transfer (on a loopback capture)");
        }
        if (!transfer && (freqs != null || referenceChannel != null)) {
            throw new UserInputException((freqs != null ? "--freqs" : "--reference-channel") + " applies to --transfer only");
        }
        if (voltsPerFs != null && !(voltsPerFs > 0 && Double.isFinite(voltsPerFs))) {
            throw new UserInputException("--volts-per-fs: expected a positive number of volts, found " + voltsPerFs);
        }
        double[] points = freqs == null ? null : Inputs.frequencies(freqs, "--freqs");
        CircuitModel model = against == null ? null : Inputs.model(against);
        Calibration cal = null;
        if (calibration != null) {
            try {
                cal = Calibration.read(calibration);
            } catch (CalibrationException e) {
                throw new UserInputException(e.getMessage());
            }
        }
        try (WavReader reader = open()) {
            WavFormat f = reader.format();
            if (cal != null) {
                try {
                    cal.checkRate(f.sampleRateHz());
                } catch (CalibrationException e) {
                    throw new UserInputException(e.getMessage());
                }
            }
            int[] channels = transfer ? transferChannels(f) : new int[] {channelIndex(channel == null ? 1 : channel,
                    "--channel", f.channels())};
            int n = segmentLength(f.sampleRateHz(), table);
            if (reader.frames() < n) {
                throw new UserInputException(Numbers.f("%s: the capture is %.2f s (%d frames), shorter than one "
                        + "analysis segment of %d frames (%.2f s)%s; record longer, raise the low end of --range, or set --segment",
                        name(), reader.frames() / (double) f.sampleRateHz(), reader.frames(), n,
                        n / (double) f.sampleRateHz(), segment == null ? " that the " + table.band(0).label() + " Hz band needs" : ""));
            }
            if (f.sampleRateHz() / 2.0 <= table.band(0).lowHz()) {
                throw new UserInputException(name() + ": every band of --range lies above the Nyquist frequency "
                        + f.sampleRateHz() / 2.0 + " Hz");
            }
            double volts = voltsPerFs != null ? voltsPerFs : cal != null ? cal.voltsPerFullScale() : Double.NaN;
            String out = transfer ? transfer(reader, f, n, channels[0], channels[1], table, target, model, cal, volts, points, r)
                    : noise(reader, f, n, channels[0], table, target, model, volts);
            PrintWriter pw = spec.commandLine().getOut();
            pw.print(out);
            pw.flush();
            return 0;
        } catch (WavFormatException e) {
            throw new UserInputException(e.getMessage());
        } catch (IOException e) {
            throw new UserInputException(name() + ": cannot read (" + e.getMessage() + ")");
        }
    }

    private WavReader open() throws IOException {
        if (Files.isDirectory(file)) {
            throw new UserInputException(name() + ": is a folder, not a WAV file");
        }
        try {
            return WavReader.open(file);
        } catch (NoSuchFileException e) {
            throw new UserInputException(name() + ": no such file");
        } catch (AccessDeniedException e) {
            throw new UserInputException(name() + ": permission denied");
        }
    }

    private int segmentLength(int sampleRateHz, BandTable table) {
        if (segment != null) {
            if (segment < MIN_SEGMENT || segment > WelchSettings.MAX_SEGMENT_LENGTH || segment % 2 != 0) {
                throw new UserInputException("--segment: expected an even number of samples from " + MIN_SEGMENT + " to "
                        + WelchSettings.MAX_SEGMENT_LENGTH + ", found " + segment);
            }
            return segment;
        }
        try {
            return BandLevels.autoSegmentLength(sampleRateHz, table);
        } catch (IllegalArgumentException e) {
            throw new UserInputException("--range: " + e.getMessage());
        }
    }

    private int channelIndex(Integer oneBased, String option, int channels) {
        if (oneBased < 1 || oneBased > channels) {
            throw new UserInputException(name() + ": " + option + " " + oneBased + " is out of range; the file has "
                    + channels + (channels == 1 ? " channel" : " channels"));
        }
        return oneBased - 1;
    }

    private String noise(WavReader reader, WavFormat f, int n, int ch, BandTable table, TargetSlope target,
            CircuitModel model, double volts) throws IOException {
        WelchEstimator est = new WelchEstimator();
        est.prepare(f.sampleRateHz(), WelchSettings.of(n));
        double[] buf = new double[BLOCK_FRAMES * f.channels()];
        for (int got; (got = reader.readFrames(buf, BLOCK_FRAMES)) > 0; ) {
            est.acceptInterleaved(buf, got, f.channels(), ch);
        }
        SpectralDensity d = est.snapshot();
        if (!Double.isNaN(volts)) {
            d = d.inVolts(volts);
        }
        NoiseSourceResult res;
        try {
            res = NoiseSourceResult.of(d, table, target, model);
        } catch (IllegalArgumentException e) {
            throw new UserInputException(name() + ": " + e.getMessage());
        }
        if (plot != null) {
            CompareCommand.writePlot(org.roseate.plot.Charts.measurement(file.getFileName().toString(), res), plot, force);
        }
        return switch (format) {
            case json -> json(noiseJson(res, ch + 1));
            case csv -> bandsCsv(res.levels(), res.deviation().readings(), res.designDifferenceDb());
            default -> noiseTable(res, ch + 1);
        };
    }

    /** {reference, response}, zero-based. */
    private int[] transferChannels(WavFormat f) {
        if (f.channels() < 2) {
            throw new UserInputException(name() + ": --transfer needs two channels; the file has 1");
        }
        int ref = channelIndex(referenceChannel == null ? 1 : referenceChannel, "--reference-channel", f.channels());
        int resp;
        if (channel != null) {
            resp = channelIndex(channel, "--channel", f.channels());
        } else if (f.channels() == 2) {
            resp = 1 - ref;
        } else {
            throw new UserInputException(name() + ": has " + f.channels() + " channels; name the response with --channel");
        }
        if (resp == ref) {
            throw new UserInputException("--channel and --reference-channel are both " + (ref + 1) + "; they must differ");
        }
        return new int[] {ref, resp};
    }

    private String transfer(WavReader reader, WavFormat f, int n, int ref, int resp, BandTable table,
            TargetSlope target, CircuitModel model, Calibration cal, double volts, double[] points, FrequencyRange r)
            throws IOException {
        CrossSpectrumEstimator est = new CrossSpectrumEstimator();
        est.prepare(f.sampleRateHz(), WelchSettings.of(n));
        double[] buf = new double[BLOCK_FRAMES * f.channels()];
        for (int got; (got = reader.readFrames(buf, BLOCK_FRAMES)) > 0; ) {
            est.acceptInterleaved(buf, got, f.channels(), ref, resp);
        }
        TransferEstimate raw = est.snapshot().transfer();
        if (saveCalibration != null) {
            try {
                Calibration.fromLoopback(saveCalibration.toString(), raw, volts).write(saveCalibration);
            } catch (CalibrationException e) {
                throw new UserInputException(name() + ": cannot make a calibration: " + e.getMessage());
            } catch (IOException e) {
                throw new UserInputException(saveCalibration + ": cannot write (" + e.getMessage() + ")");
            }
        }
        TransferEstimate h = cal == null ? raw : cal.apply(raw);
        double lo = raw.binWidthHz();
        double hi = f.sampleRateHz() / 2.0;
        double[] hz = points != null ? points
                : LogGrid.points(Math.max(r.loHz(), lo), Math.min(r.hiHz(), hi), 20);
        for (double p : hz) {
            if (p < lo || p > hi) {
                throw new UserInputException(Numbers.f("--freqs: %s Hz is outside the resolved range %.4g … %.6g Hz "
                        + "(bin width to Nyquist)", Numbers.plain(p), lo, hi));
            }
        }
        TransferResult res;
        try {
            res = TransferResult.of(h, hz, TransferResult.DEFAULT_COHERENCE_THRESHOLD, table, target, model);
        } catch (IllegalArgumentException e) {
            throw new UserInputException(name() + ": " + e.getMessage());
        }
        return switch (format) {
            case json -> json(transferJson(res, ref + 1, resp + 1, cal != null));
            case csv -> responseCsv(res.points());
            default -> transferTable(res, ref + 1, resp + 1, cal != null);
        };
    }

    private String header(double rateHz, int n, long averages, double tEff) {
        return Numbers.f("Capture: %s, %s, segment %d (%.4g Hz bins), %d averages, T_eff %.2f s%n", file.getFileName(),
                Numbers.hz(rateHz), n, rateHz / n, averages, tEff);
    }

    private String noiseTable(NoiseSourceResult res, int ch) {
        SpectralDensity d = res.density();
        StringBuilder sb = new StringBuilder();
        sb.append(header(d.sampleRateHz(), d.settings().segmentLength(), d.averages(), d.effectiveDurationSeconds()));
        sb.append(Numbers.f("Channel %d, noise-source mode, levels in %s%n", ch, d.unit().levelSymbol()));
        sb.append(Numbers.f("Least-squares slope:   %+.3f dB/octave (target %+.3f)%n", res.slopeDbPerOctave(),
                res.target().dbPerOctave()));
        sb.append(Numbers.f("Peak band deviation:   ±%.3f dB%n", res.deviation().maxBandDeviationDb()));
        if (res.designDifferenceDb() != null) {
            sb.append(Numbers.f("Against the design:    shape difference with the mean (%+.3f dB) removed%n",
                    res.designOffsetDb()));
        }
        sb.append(Numbers.f("%n%8s %11s %11s %10s %8s %10s %10s%s%n", "band", "low Hz", "high Hz", "level", "±dB",
                "re " + res.referenceBand().label(), "dev dB", res.designDifferenceDb() != null ? "  design dB" : ""));
        List<BandLevel> levels = res.levels();
        for (int i = 0; i < levels.size(); i++) {
            BandLevel b = levels.get(i);
            sb.append(Numbers.f("%8s %11.2f %11.2f %10.3f %8.3f %+10.3f %+10.3f", b.band().label(), b.band().lowHz(),
                    b.band().highHz(), b.levelDb(), b.uncertaintyDb(), res.normalizedDb()[i],
                    res.deviation().readings().get(i).deviationDb()));
            if (res.designDifferenceDb() != null) {
                sb.append(Numbers.f(" %+10.3f", res.designDifferenceDb()[i]));
            }
            sb.append(b.complete() ? "" : "  (cut at Nyquist)").append(b.bins() < BandLevels.MIN_BINS_PER_BAND
                    ? Numbers.f("  (%.1f bins)", b.bins()) : "").append('\n');
        }
        sb.append('\n').append(NOISE_LEGEND).append('\n');
        return sb.toString();
    }

    private String transferTable(TransferResult res, int ref, int resp, boolean calibrated) {
        TransferEstimate h = res.estimate();
        StringBuilder sb = new StringBuilder();
        sb.append(Numbers.f("Capture: %s, %s, segment %d (%.4g Hz bins), %d averages%n", file.getFileName(),
                Numbers.hz(h.sampleRateHz()), h.segmentLength(), h.binWidthHz(), h.averages()));
        sb.append(Numbers.f("Transfer from channel %d (reference) to channel %d (response)%s%n", ref, resp,
                calibrated ? ", calibrated" : ""));
        sb.append(Numbers.f("Least-squares slope:   %+.3f dB/octave (target %+.3f)%n", res.slopeDbPerOctave(),
                res.target().dbPerOctave()));
        sb.append(Numbers.f("Peak band deviation:   ±%.3f dB%n", res.deviation().maxBandDeviationDb()));
        sb.append(Numbers.f("%n%8s %11s %11s %10s %10s%s%n", "band", "low Hz", "high Hz", "level dB", "dev dB",
                res.designDifferenceDb() != null ? "  design dB" : ""));
        for (int i = 0; i < res.levels().size(); i++) {
            BandLevel b = res.levels().get(i);
            sb.append(Numbers.f("%8s %11.2f %11.2f %10.3f %+10.3f", b.band().label(), b.band().lowHz(), b.band().highHz(),
                    b.levelDb(), res.deviation().readings().get(i).deviationDb()));
            if (res.designDifferenceDb() != null) {
                sb.append(Numbers.f(" %+10.3f", res.designDifferenceDb()[i]));
            }
            sb.append('\n');
        }
        sb.append(Numbers.f("%n%12s %10s %9s %9s %10s %10s%n", "Hz", "dB", "deg", "γ²", "target dB", "model dB"));
        for (TransferResult.Point p : res.points()) {
            sb.append(Numbers.f("%12.4f %10.3f %9.2f %9.4f %10.3f %10s%s%n", p.hz(), p.db(), p.deg(), p.coherence(),
                    p.targetDb(), Double.isNaN(p.modelDb()) ? "" : Numbers.f("%.3f", p.modelDb()), p.trusted() ? "" : " *"));
        }
        sb.append('\n').append(TRANSFER_LEGEND).append('\n');
        return sb.toString();
    }

    private static void put(ObjectNode o, String key, double v) {
        if (Double.isFinite(v)) {
            o.put(key, v);
        } else {
            o.putNull(key);
        }
    }

    private void putBands(ObjectNode root, List<BandLevel> levels, List<BandReading> dev, double[] normalized,
            double[] design) {
        ArrayNode arr = root.putArray("bands");
        for (int i = 0; i < levels.size(); i++) {
            BandLevel b = levels.get(i);
            ObjectNode o = arr.addObject();
            o.put("nominalHz", b.band().nominalHz());
            o.put("lowHz", b.band().lowHz());
            o.put("highHz", b.band().highHz());
            put(o, "db", b.levelDb());
            put(o, "uncertaintyDb", b.uncertaintyDb());
            put(o, "deviationDb", dev.get(i).deviationDb());
            put(o, "normalizedDb", normalized[i]);
            if (design != null) {
                put(o, "designDifferenceDb", design[i]);
            }
            o.put("complete", b.complete());
        }
    }

    private ObjectNode noiseJson(NoiseSourceResult res, int ch) {
        SpectralDensity d = res.density();
        ObjectNode root = new ObjectMapper().createObjectNode();
        root.put("file", file.getFileName().toString());
        root.put("mode", "noise");
        root.put("sampleRateHz", d.sampleRateHz());
        root.put("channel", ch);
        root.put("segmentLength", d.settings().segmentLength());
        root.put("resolutionHz", d.binWidthHz());
        root.put("averages", d.averages());
        root.put("effectiveSeconds", d.effectiveDurationSeconds());
        root.put("unit", d.unit().levelSymbol());
        root.put("bandFraction", res.levels().get(0).band().fraction() == BandFraction.OCTAVE ? "octave" : "third");
        root.put("targetSlopeDbPerOctave", res.target().dbPerOctave());
        root.put("referenceBandHz", res.referenceBand().nominalHz());
        put(root, "slopeDbPerOctave", res.slopeDbPerOctave());
        root.put("maxBandDeviationDb", res.deviation().maxBandDeviationDb());
        if (res.designDifferenceDb() != null) {
            root.put("designOffsetDb", res.designOffsetDb());
        }
        putBands(root, res.levels(), res.deviation().readings(), res.normalizedDb(), res.designDifferenceDb());
        root.put("legend", NOISE_LEGEND);
        return root;
    }

    private ObjectNode transferJson(TransferResult res, int ref, int resp, boolean calibrated) {
        TransferEstimate h = res.estimate();
        ObjectNode root = new ObjectMapper().createObjectNode();
        root.put("file", file.getFileName().toString());
        root.put("mode", "transfer");
        root.put("sampleRateHz", h.sampleRateHz());
        root.put("referenceChannel", ref);
        root.put("responseChannel", resp);
        root.put("calibrated", calibrated);
        root.put("segmentLength", h.segmentLength());
        root.put("resolutionHz", h.binWidthHz());
        root.put("averages", h.averages());
        root.put("coherenceThreshold", res.coherenceThreshold());
        root.put("targetSlopeDbPerOctave", res.target().dbPerOctave());
        root.put("referenceBandHz", res.referenceBand().nominalHz());
        put(root, "slopeDbPerOctave", res.slopeDbPerOctave());
        root.put("maxBandDeviationDb", res.deviation().maxBandDeviationDb());
        if (res.designDifferenceDb() != null) {
            root.put("designOffsetDb", res.designOffsetDb());
        }
        putBands(root, res.levels(), res.deviation().readings(), res.normalizedDb(), res.designDifferenceDb());
        ArrayNode arr = root.putArray("response");
        for (TransferResult.Point p : res.points()) {
            ObjectNode o = arr.addObject();
            o.put("hz", p.hz());
            put(o, "db", p.db());
            put(o, "deg", p.deg());
            put(o, "coherence", p.coherence());
            o.put("trusted", p.trusted());
            put(o, "targetDb", p.targetDb());
            if (!Double.isNaN(p.modelDb())) {
                o.put("modelDb", p.modelDb());
            }
        }
        root.put("legend", TRANSFER_LEGEND);
        return root;
    }

    private static String json(ObjectNode root) {
        try {
            return new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT).writeValueAsString(root) + "\n";
        } catch (com.fasterxml.jackson.core.JsonProcessingException e) {
            throw new IllegalStateException(e);
        }
    }

    private static String bandsCsv(List<BandLevel> levels, List<BandReading> dev, double[] design) {
        StringBuilder sb = new StringBuilder("nominalHz,lowHz,highHz,db,uncertaintyDb,deviationDb"
                + (design != null ? ",designDifferenceDb" : "") + "\n");
        for (int i = 0; i < levels.size(); i++) {
            BandLevel b = levels.get(i);
            sb.append(Numbers.plain(b.band().nominalHz())).append(',').append(Numbers.plain(b.band().lowHz())).append(',')
                    .append(Numbers.plain(b.band().highHz())).append(',').append(Numbers.plain(b.levelDb())).append(',')
                    .append(Numbers.plain(b.uncertaintyDb())).append(',').append(Numbers.plain(dev.get(i).deviationDb()));
            if (design != null) {
                sb.append(',').append(Numbers.plain(design[i]));
            }
            sb.append('\n');
        }
        return sb.toString();
    }

    private static String responseCsv(List<TransferResult.Point> points) {
        StringBuilder sb = new StringBuilder("hz,db,deg,coherence,trusted,targetDb,modelDb\n");
        for (TransferResult.Point p : points) {
            sb.append(Numbers.plain(p.hz())).append(',').append(Numbers.plain(p.db())).append(',')
                    .append(Numbers.plain(p.deg())).append(',').append(Numbers.plain(p.coherence())).append(',')
                    .append(p.trusted()).append(',').append(Numbers.plain(p.targetDb())).append(',')
                    .append(Numbers.plain(p.modelDb())).append('\n');
        }
        return sb.toString();
    }
}
