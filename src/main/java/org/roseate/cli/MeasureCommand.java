package org.roseate.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import org.roseate.bands.BandFraction;
import org.roseate.bands.BandTable;
import org.roseate.compare.FrequencyRange;
import org.roseate.compare.TargetSlope;
import org.roseate.io.WavReader;
import org.roseate.measure.BandReader;
import org.roseate.measure.FileMeasure;
import org.roseate.measure.MeasureCsv;
import org.roseate.measure.MeasureException;
import org.roseate.measure.MeasureJson;
import org.roseate.measure.MeasureRequest;
import org.roseate.measure.MeasureResult;
import org.roseate.measure.MeasureTable;
import org.roseate.model.CircuitModel;
import org.roseate.spectrum.Calibration;
import org.roseate.spectrum.CalibrationException;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;


/** {@code measure FILE.wav}: band levels of a captured noise source, or the transfer function of a circuit. */
@Command(name = "measure", mixinStandardHelpOptions = true,
        description = "Measure a built circuit from a WAV capture: band levels of a noise source (one channel), "
                + "or with --transfer the response between a reference and a response channel. In transfer mode "
                + "the bands are compared with a target only when --slope is given.")
final class MeasureCommand implements Callable<Integer> {

    enum Format { table, json, csv }

    @picocli.CommandLine.Mixin
    BandOptions bandOptions = new BandOptions();

    @picocli.CommandLine.Mixin
    SweepOptions sweep = new SweepOptions();

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

    @Option(names = "--bank", description = "noise-source mode: read the bands with the time-domain filter bank "
            + "(Butterworth band-pass per band) instead of the FFT")
    boolean bank;

    @Option(names = "--against", paramLabel = "DESIGN.json", description = "compare with a design's predicted levels")
    Path against;

    @Option(names = "--calibration", paramLabel = "cal.json", description = "divide out a loopback calibration, in both modes (and use its volts per full scale)")
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

    @Override
    public Integer call() {
        if (sweep.enabled()) {
            return sweepMeasurement();
        }
        if (live) {
            if (file != null) {
                throw new UserInputException("measure: give a WAV file or --live, not both");
            }
            checkOptions();
            file = LiveCapture.record(new LiveCapture.Request(device, outputDevice, rateHz, seconds, levelDbfs, allowLoud,
                    transfer, channel, saveCapture, force), spec.commandLine().getErr());
        } else if (file == null) {
            throw new UserInputException("measure: name a WAV file, or record one with --live");
        } else if (saveCapture != null) {
            throw new UserInputException("--save-capture applies to --live only");
        }
        try {
            return analyse();
        } finally {
            if (live && saveCapture == null) {
                LiveCapture.deleteTemporary(file, spec.commandLine().getErr());
            }
        }
    }

    /** {@code --sweep}: the exponential swept sine instead of noise, from a file or live. */
    private Integer sweepMeasurement() {
        String[] noiseOnly = {"--bank", "--plot", "--against", "--calibration", "--save-calibration", "--save-capture",
            "--freqs", "--segment", "--volts-per-fs", "--range", "--bands", "--slope"};
        for (String name : noiseOnly) {
            if (spec.commandLine().getParseResult().hasMatchedOption(name)) {
                throw new UserInputException(name + " does not apply to --sweep measurements");
            }
        }
        if (live == (file != null)) {
            throw new UserInputException(live ? "--live records its own capture; leave out " + file
                    : "measure: name a WAV file, or record one with --live");
        }
        if (!transfer && referenceChannel != null) {
            throw new UserInputException("--reference-channel applies to --transfer only");
        }
        int resp = (channel != null ? channel : transfer ? 2 : 1) - 1;
        int ref = transfer ? (referenceChannel != null ? referenceChannel : 1) - 1 : -1;
        if (transfer && channel == null && ref == 1) {
            resp = 0;
        }
        PrintWriter err = spec.commandLine().getErr();
        org.roseate.sweep.SweepResult r = SweepMeasurement.measure(file, sweep, live, resp, ref, outputDevice, device,
                rateHz, levelDbfs, allowLoud, err);
        err.flush();
        PrintWriter out = spec.commandLine().getOut();
        out.print(SweepMeasurement.format(r, format.name()));
        out.flush();
        return 0;
    }

    /** Refuses option combinations that mean nothing, before any recording or reading. */
    private void checkOptions() {
        CompareCommand.checkPlotName(plot);
        if (plot != null && transfer) {
            throw new UserInputException("--plot draws noise-source measurements; leave out --transfer");
        }
        if (bank && transfer) {
            throw new UserInputException("--bank reads noise-source band levels; leave out --transfer");
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
        if (channel != null && channel < 1) {
            throw new UserInputException("--channel " + channel + ": channels count from 1");
        }
        if (referenceChannel != null && referenceChannel < 1) {
            throw new UserInputException("--reference-channel " + referenceChannel + ": channels count from 1");
        }
    }

    /** The request the options describe; the file is opened only to pick the response channel of a transfer. */
    MeasureRequest request() {
        FrequencyRange r = bandOptions.range();
        BandFraction fraction = bandOptions.fraction();
        BandTable table;
        try {
            table = BandTable.of(fraction, r.loHz(), r.hiHz());
        } catch (IllegalArgumentException e) {
            throw new UserInputException("--range: " + e.getMessage());
        }
        boolean slopeGiven = spec.commandLine().getParseResult() != null
                && spec.commandLine().getParseResult().hasMatchedOption("--slope");
        TargetSlope target = transfer && !slopeGiven ? null : bandOptions.target();
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
        try {
            MeasureRequest q;
            if (transfer) {
                int ref = (referenceChannel == null ? 1 : referenceChannel) - 1;
                int resp = channel != null ? channel - 1 : otherChannel(ref);
                q = MeasureRequest.transfer(table, r, target, ref, resp).withResponseHz(points);
            } else {
                q = MeasureRequest.noiseSource(table, r, target).withResponseChannel((channel == null ? 1 : channel) - 1)
                        .withReader(bank ? BandReader.FILTER_BANK : BandReader.WELCH);
            }
            return q.withDesign(model).withCalibration(cal).withVoltsPerFullScale(voltsPerFs == null ? Double.NaN : voltsPerFs)
                    .withSegmentLength(segment == null ? 0 : segment);
        } catch (MeasureException e) {
            throw new UserInputException(e.getMessage());
        }
    }

    /** In a two-channel file the response is the channel that is not the reference. */
    private int otherChannel(int ref) {
        int channels = 2;
        try (WavReader reader = WavReader.open(file)) {
            channels = reader.format().channels();
        } catch (IOException | RuntimeException e) {
            // the measurement itself reports an unreadable file, with the same message as ever
        }
        if (channels > 2) {
            throw new UserInputException(file + ": has " + channels + " channels; name the response with --channel");
        }
        return ref == 0 ? 1 : 0;
    }

    private Integer analyse() {
        checkOptions();
        MeasureRequest q = request();
        MeasureResult res;
        try {
            res = FileMeasure.run(file, q);
        } catch (MeasureException e) {
            throw new UserInputException(e.getMessage());
        }
        PrintWriter err = spec.commandLine().getErr();
        for (String w : res.warnings()) {
            err.println("roseate: " + w);
        }
        err.flush();
        if (saveCalibration != null) {
            try {
                Calibration.fromLoopback(saveCalibration.toString(), res.rawTransfer(),
                        voltsPerFs == null ? Double.NaN : voltsPerFs).write(saveCalibration);
            } catch (CalibrationException e) {
                throw new UserInputException(file + ": cannot make a calibration: " + e.getMessage());
            } catch (IOException e) {
                throw new UserInputException(saveCalibration + ": cannot write (" + e.getMessage() + ")");
            }
        }
        if (plot != null) {
            CompareCommand.writePlot(org.roseate.plot.Charts.measurement(file.getFileName().toString(), res), plot, force);
        }
        String out = switch (format) {
            case json -> MeasureJson.of(res);
            case csv -> MeasureCsv.of(res);
            default -> MeasureTable.of(res);
        };
        PrintWriter pw = spec.commandLine().getOut();
        pw.print(out);
        pw.flush();
        return 0;
    }
}
