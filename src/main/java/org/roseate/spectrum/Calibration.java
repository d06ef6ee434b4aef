package org.roseate.spectrum;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.Objects;
import org.roseate.io.AtomicOutput;

/**
 * The response of the measuring chain itself (sound-card output to input through a straight
 * cable), measured once in transfer mode and divided out of later transfer measurements, plus an
 * optional volts-per-full-scale factor for absolute levels. Immutable; arrays copied.
 *
 * <p>File format (JSON, UTF-8): {@code {"kind": "roseate-calibration", "version": 1,
 * "sampleRateHz": 48000, "segmentLength": 32768, "voltsPerFullScale": 1.23 | null,
 * "frequenciesHz": […], "re": […], "im": […]}}, bins above DC only (H at DC is undefined after
 * detrending).
 *
 * @param source            the file name it was read from or will be written to, for messages
 * @param sampleRateHz      the rate the calibration was made at, Hz
 * @param segmentLength     the FFT length it was made with
 * @param frequenciesHz     ascending, &gt; 0, Hz
 * @param re                real part of the chain's H per frequency
 * @param im                imaginary part
 * @param voltsPerFullScale volts peak at full scale of the input, or NaN if not known
 */
public record Calibration(String source, double sampleRateHz, int segmentLength, double[] frequenciesHz, double[] re,
        double[] im, double voltsPerFullScale) {
    private static final String KIND = "roseate-calibration";

    public Calibration {
        Objects.requireNonNull(source, "source");
        frequenciesHz = frequenciesHz.clone();
        re = re.clone();
        im = im.clone();
        if (frequenciesHz.length < 2 || re.length != frequenciesHz.length || im.length != frequenciesHz.length) {
            throw new CalibrationException(source, "needs at least two frequencies and as many re and im values");
        }
        for (int i = 0; i < frequenciesHz.length; i++) {
            if (!(frequenciesHz[i] > (i == 0 ? 0 : frequenciesHz[i - 1])) || !Double.isFinite(frequenciesHz[i])) {
                throw new CalibrationException(source, "frequenciesHz must be positive and ascending; entry " + (i + 1)
                        + " is " + frequenciesHz[i]);
            }
            if (!Double.isFinite(re[i]) || !Double.isFinite(im[i]) || re[i] * re[i] + im[i] * im[i] == 0) {
                throw new CalibrationException(source, "response at " + frequenciesHz[i]
                        + " Hz is zero or not finite; was the cable connected?");
            }
        }
        if (!(sampleRateHz > 0) || !Double.isFinite(sampleRateHz)) {
            throw new CalibrationException(source, "sampleRateHz " + sampleRateHz + " must be finite and > 0");
        }
        if (!Double.isNaN(voltsPerFullScale) && !(voltsPerFullScale > 0 && Double.isFinite(voltsPerFullScale))) {
            throw new CalibrationException(source, "voltsPerFullScale " + voltsPerFullScale + " must be > 0");
        }
    }

    @Override
    public double[] frequenciesHz() {
        return frequenciesHz.clone();
    }

    @Override
    public double[] re() {
        return re.clone();
    }

    @Override
    public double[] im() {
        return im.clone();
    }

    /**
     * A calibration from a loopback transfer estimate: every bin above DC.
     *
     * @param voltsPerFullScale volts peak at full scale, or NaN
     * @throws CalibrationException if H is zero or not finite in some bin (nothing connected)
     */
    public static Calibration fromLoopback(String source, TransferEstimate loopback, double voltsPerFullScale) {
        int b = loopback.size() - 1;
        double[] f = new double[b];
        double[] r = new double[b];
        double[] i = new double[b];
        double[] lf = loopback.frequenciesHz();
        double[] lr = loopback.re();
        double[] li = loopback.im();
        System.arraycopy(lf, 1, f, 0, b);
        System.arraycopy(lr, 1, r, 0, b);
        System.arraycopy(li, 1, i, 0, b);
        return new Calibration(source, loopback.sampleRateHz(), loopback.segmentLength(), f, r, i, voltsPerFullScale);
    }

    /**
     * Checks that a capture was made at this calibration's rate.
     *
     * @throws CalibrationException "cal.json: calibration was made at 44100 Hz, the capture is 48000 Hz"
     */
    public void checkRate(double captureRateHz) {
        if (captureRateHz != sampleRateHz) {
            throw new CalibrationException(source, "calibration was made at " + hz(sampleRateHz)
                    + " Hz, the capture is " + hz(captureRateHz) + " Hz");
        }
    }

    /**
     * The measurement with the chain's response divided out, bin by bin, the calibration linearly
     * interpolated in frequency (on re and im) and held at its ends.
     *
     * @throws CalibrationException if the sample rates differ
     */
    public TransferEstimate apply(TransferEstimate measured) {
        checkRate(measured.sampleRateHz());
        return measured.dividedBy(frequenciesHz, re, im);
    }

    /**
     * |H|² of the chain at each frequency, interpolated as {@link #apply} does (linearly on re and im,
     * held constant beyond the ends): the factor a noise-source density is divided by.
     *
     * @param hz frequencies, Hz, any order
     */
    public double[] magnitudeSquaredAt(double[] hz) {
        double[] out = new double[hz.length];
        for (int k = 0; k < hz.length; k++) {
            double f = hz[k];
            double cr;
            double ci;
            if (f <= frequenciesHz[0]) {
                cr = re[0];
                ci = im[0];
            } else if (f >= frequenciesHz[frequenciesHz.length - 1]) {
                cr = re[re.length - 1];
                ci = im[im.length - 1];
            } else {
                int j = java.util.Arrays.binarySearch(frequenciesHz, f);
                if (j < 0) {
                    j = -j - 2;
                }
                j = Math.min(j, frequenciesHz.length - 2);
                double t = (f - frequenciesHz[j]) / (frequenciesHz[j + 1] - frequenciesHz[j]);
                cr = re[j] + t * (re[j + 1] - re[j]);
                ci = im[j] + t * (im[j + 1] - im[j]);
            }
            out[k] = cr * cr + ci * ci;
        }
        return out;
    }

    /**
     * The chain's low corner: the highest calibrated frequency below {@value #CORNER_REFERENCE_HZ} Hz
     * where |H| has fallen {@code dropDb} below its value at {@value #CORNER_REFERENCE_HZ} Hz (a sound
     * card's AC coupling), Hz; NaN when it never falls that far within the calibration. Below it the
     * correction is large and rests on a falling response, so readings there are marked.
     *
     * @param dropDb &gt; 0, dB
     */
    public double lowCornerHz(double dropDb) {
        double ref = 10 * Math.log10(magnitudeSquaredAt(new double[] {CORNER_REFERENCE_HZ})[0]);
        for (int k = frequenciesHz.length - 1; k >= 0; k--) {
            if (frequenciesHz[k] >= CORNER_REFERENCE_HZ) {
                continue;
            }
            double db = 10 * Math.log10(re[k] * re[k] + im[k] * im[k]);
            if (db < ref - dropDb) {
                return frequenciesHz[k];
            }
        }
        return Double.NaN;
    }

    /** The frequency the low corner is judged against, Hz. */
    public static final double CORNER_REFERENCE_HZ = 1000;

    /** Writes the file atomically, replacing an existing one. */
    public void write(Path file) throws IOException {
        ObjectMapper m = new ObjectMapper();
        ObjectNode root = m.createObjectNode();
        root.put("kind", KIND);
        root.put("version", 1);
        root.put("sampleRateHz", sampleRateHz);
        root.put("segmentLength", segmentLength);
        if (Double.isNaN(voltsPerFullScale)) {
            root.putNull("voltsPerFullScale");
        } else {
            root.put("voltsPerFullScale", voltsPerFullScale);
        }
        ArrayNode f = root.putArray("frequenciesHz");
        ArrayNode r = root.putArray("re");
        ArrayNode i = root.putArray("im");
        for (int k = 0; k < frequenciesHz.length; k++) {
            f.add(frequenciesHz[k]);
            r.add(re[k]);
            i.add(im[k]);
        }
        AtomicOutput.writeString(file, m.writeValueAsString(root) + "\n", true);
    }

    /**
     * Reads a calibration file; every problem is a one-line {@link CalibrationException} naming it.
     */
    public static Calibration read(Path file) {
        String name = file.toString();
        String text;
        try {
            text = Files.readString(file);
        } catch (NoSuchFileException e) {
            throw new CalibrationException(name, "no such file");
        } catch (IOException e) {
            throw new CalibrationException(name, "cannot read (" + e.getMessage() + ")");
        }
        JsonNode root;
        try {
            root = new ObjectMapper().readTree(text);
        } catch (JsonProcessingException e) {
            throw new CalibrationException(name, "invalid JSON at line " + e.getLocation().getLineNr()
                    + ", column " + e.getLocation().getColumnNr());
        }
        if (root == null || !root.isObject() || !KIND.equals(root.path("kind").asText())) {
            throw new CalibrationException(name, "not a calibration file (expected \"kind\": \"" + KIND + "\")");
        }
        double rate = number(name, root, "sampleRateHz");
        double seg = number(name, root, "segmentLength");
        JsonNode v = root.get("voltsPerFullScale");
        double volts = v == null || v.isNull() ? Double.NaN : number(name, root, "voltsPerFullScale");
        return new Calibration(name, rate, (int) seg, array(name, root, "frequenciesHz"), array(name, root, "re"),
                array(name, root, "im"), volts);
    }

    private static double number(String name, JsonNode root, String key) {
        JsonNode n = root.get(key);
        if (n == null || !n.isNumber()) {
            throw new CalibrationException(name, "missing or non-numeric key '" + key + "'");
        }
        return n.asDouble();
    }

    private static double[] array(String name, JsonNode root, String key) {
        JsonNode n = root.get(key);
        if (n == null || !n.isArray()) {
            throw new CalibrationException(name, "missing array '" + key + "'");
        }
        double[] out = new double[n.size()];
        for (int i = 0; i < out.length; i++) {
            if (!n.get(i).isNumber()) {
                throw new CalibrationException(name, "'" + key + "' entry " + (i + 1) + " is not a number");
            }
            out[i] = n.get(i).asDouble();
        }
        return out;
    }

    private static String hz(double v) {
        return v == Math.rint(v) ? Long.toString((long) v) : Double.toString(v);
    }
}
