package org.roseate.audio;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import javax.sound.sampled.AudioFormat;
import javax.sound.sampled.AudioSystem;
import javax.sound.sampled.DataLine;
import javax.sound.sampled.Line;
import javax.sound.sampled.LineUnavailableException;
import javax.sound.sampled.Mixer;
import javax.sound.sampled.SourceDataLine;
import javax.sound.sampled.TargetDataLine;

/**
 * The sound devices Java Sound offers ({@code javax.sound.sampled} mixers), their formats, and
 * opening an output or input line on one of them.
 *
 * <p>A device is a mixer; its index is its position in {@code AudioSystem.getMixerInfo()}, one
 * numbering for outputs and inputs. The default device is the one Roseate opens when none is named:
 * the mixer named by the system property {@code javax.sound.sampled.SourceDataLine} (or
 * {@code TargetDataLine}) if set, else the first mixer offering the line, for output preferring one
 * that can mix several lines (this follows how Java Sound's {@code AudioSystem.getLine} picks,
 * from memory of the JDK sources).
 *
 * <p>Lines carry signed little-endian PCM; 16 bits is tried first, then 24 and 32 for devices that
 * take only wider samples.
 */
public final class Devices {
    /** Rates probed for the device list, Hz. */
    public static final int[] PROBE_RATES_HZ = {44100, 48000, 96000, 192000};
    /** Channel counts probed for the device list. */
    public static final int[] PROBE_CHANNELS = {1, 2};
    private static final int[] BITS_TRIED = {16, 24, 32};

    private Devices() {
    }

    /** One rate and channel count a device accepts at 16 bits. */
    public record Probe(int sampleRateHz, int channels) {
    }

    /**
     * A device as listed.
     *
     * @param index         position in Java Sound's mixer list
     * @param name          mixer name (what {@code --device} matches)
     * @param description   mixer description
     * @param defaultOutput true if it is the default output
     * @param defaultInput  true if it is the default input
     * @param outputs       supported 16-bit output rates × channels (empty: not an output)
     * @param inputs        supported 16-bit input rates × channels (empty: not an input)
     * @param hasOutput     offers a SourceDataLine at all
     * @param hasInput      offers a TargetDataLine at all
     */
    public record Device(int index, String name, String description, boolean defaultOutput, boolean defaultInput,
            List<Probe> outputs, List<Probe> inputs, boolean hasOutput, boolean hasInput) {
        public Device {
            outputs = List.copyOf(outputs);
            inputs = List.copyOf(inputs);
        }
    }

    /** Every mixer that offers an output or input data line, with probed formats. */
    public static List<Device> list() {
        Mixer.Info[] infos = AudioSystem.getMixerInfo();
        int defOut = defaultIndex(infos, SourceDataLine.class);
        int defIn = defaultIndex(infos, TargetDataLine.class);
        List<Device> out = new ArrayList<>();
        for (int i = 0; i < infos.length; i++) {
            Mixer m = AudioSystem.getMixer(infos[i]);
            boolean hasOut = m.isLineSupported(new Line.Info(SourceDataLine.class));
            boolean hasIn = m.isLineSupported(new Line.Info(TargetDataLine.class));
            if (!hasOut && !hasIn) {
                continue;
            }
            out.add(new Device(i, infos[i].getName(), infos[i].getDescription(), i == defOut, i == defIn,
                    hasOut ? probe(m, SourceDataLine.class) : List.of(), hasIn ? probe(m, TargetDataLine.class) : List.of(),
                    hasOut, hasIn));
        }
        return out;
    }

    private static List<Probe> probe(Mixer m, Class<? extends DataLine> kind) {
        List<Probe> ok = new ArrayList<>();
        for (int rate : PROBE_RATES_HZ) {
            for (int ch : PROBE_CHANNELS) {
                AudioFormat f = format(rate, ch, 16);
                for (Line.Info li : kind == SourceDataLine.class ? m.getSourceLineInfo() : m.getTargetLineInfo()) {
                    if (li instanceof DataLine.Info di && kind.isAssignableFrom(di.getLineClass()) && di.isFormatSupported(f)) {
                        ok.add(new Probe(rate, ch));
                        break;
                    }
                }
            }
        }
        return ok;
    }

    static AudioFormat format(int rateHz, int channels, int bits) {
        return new AudioFormat(AudioFormat.Encoding.PCM_SIGNED, rateHz, bits, channels, channels * bits / 8, rateHz, false);
    }

    private static int defaultIndex(Mixer.Info[] infos, Class<? extends DataLine> kind) {
        String prop = System.getProperty(kind.getName());
        if (prop != null && !prop.isBlank()) {
            String name = prop.contains("#") ? prop.substring(prop.indexOf('#') + 1) : prop;
            for (int i = 0; i < infos.length; i++) {
                if (infos[i].getName().equals(name)) {
                    return i;
                }
            }
        }
        Line.Info li = new Line.Info(kind);
        if (kind == SourceDataLine.class) {
            for (int i = 0; i < infos.length; i++) {
                Mixer m = AudioSystem.getMixer(infos[i]);
                int max = m.isLineSupported(li) ? m.getMaxLines(li) : 0;
                if (max == AudioSystem.NOT_SPECIFIED || max > 1) {
                    return i;
                }
            }
        }
        for (int i = 0; i < infos.length; i++) {
            if (AudioSystem.getMixer(infos[i]).isLineSupported(li)) {
                return i;
            }
        }
        return -1;
    }

    /**
     * Finds a device by index, exact name (ignoring case) or a unique part of its name; null or
     * blank means the default.
     *
     * @param output true for an output, false for an input
     * @throws AudioDeviceException of kind NO_DEVICE if none (or several) match
     */
    public static Device find(String device, boolean output) {
        List<Device> all = list();
        List<Device> usable = all.stream().filter(d -> output ? d.hasOutput() : d.hasInput()).toList();
        String what = output ? "output" : "input";
        if (usable.isEmpty()) {
            throw new AudioDeviceException(AudioDeviceException.Kind.NO_DEVICE, device == null ? "default" : device,
                    "no audio " + what + " device found (Java Sound lists none)");
        }
        if (device == null || device.isBlank()) {
            for (Device d : usable) {
                if (output ? d.defaultOutput() : d.defaultInput()) {
                    return d;
                }
            }
            return usable.get(0);
        }
        String key = device.trim();
        if (key.matches("\\d+")) {
            int idx = Integer.parseInt(key);
            for (Device d : usable) {
                if (d.index() == idx) {
                    return d;
                }
            }
            throw new AudioDeviceException(AudioDeviceException.Kind.NO_DEVICE, key,
                    "no audio " + what + " device with index " + key);
        }
        for (Device d : usable) {
            if (d.name().equalsIgnoreCase(key)) {
                return d;
            }
        }
        String lower = key.toLowerCase(Locale.ROOT);
        List<Device> partial = usable.stream().filter(d -> d.name().toLowerCase(Locale.ROOT).contains(lower)).toList();
        if (partial.size() == 1) {
            return partial.get(0);
        }
        throw new AudioDeviceException(AudioDeviceException.Kind.NO_DEVICE, key, partial.isEmpty()
                ? "no audio " + what + " device named '" + key + "'"
                : "'" + key + "' matches " + partial.size() + " " + what + " devices; give the full name or the index");
    }

    /**
     * Opens an output line (not started).
     *
     * @param device       index or name, or null for the default
     * @param rateHz       sample rate, &gt; 0
     * @param channels     1 or more
     * @param bufferFrames requested line buffer; the device may give another size ({@link OutputLine#bufferFrames()})
     * @throws AudioDeviceException if the device is missing, busy or refuses the format
     */
    public static OutputLine openOutput(String device, int rateHz, int channels, int bufferFrames) {
        checkArgs(rateHz, channels, bufferFrames);
        Device d = find(device, true);
        Mixer m = AudioSystem.getMixer(AudioSystem.getMixerInfo()[d.index()]);
        for (int bits : BITS_TRIED) {
            AudioFormat f = format(rateHz, channels, bits);
            DataLine.Info info = new DataLine.Info(SourceDataLine.class, f);
            if (!m.isLineSupported(info)) {
                continue;
            }
            SourceDataLine line = (SourceDataLine) getLine(m, info, d, f);
            try {
                line.open(f, bufferFrames * f.getFrameSize());
            } catch (LineUnavailableException | IllegalStateException | SecurityException e) {
                throw busy(d, e);
            } catch (IllegalArgumentException e) {
                throw unsupported(d, f, e);
            }
            return new JavaSoundOutput(line, d.name(), rateHz, channels, bits);
        }
        throw unsupported(d, format(rateHz, channels, 16), null);
    }

    /**
     * Opens an input line (not started), as {@link #openOutput}.
     *
     * @throws AudioDeviceException if the device is missing, busy or refuses the format
     */
    public static InputLine openInput(String device, int rateHz, int channels, int bufferFrames) {
        checkArgs(rateHz, channels, bufferFrames);
        Device d = find(device, false);
        Mixer m = AudioSystem.getMixer(AudioSystem.getMixerInfo()[d.index()]);
        for (int bits : BITS_TRIED) {
            AudioFormat f = format(rateHz, channels, bits);
            DataLine.Info info = new DataLine.Info(TargetDataLine.class, f);
            if (!m.isLineSupported(info)) {
                continue;
            }
            TargetDataLine line = (TargetDataLine) getLine(m, info, d, f);
            try {
                line.open(f, bufferFrames * f.getFrameSize());
            } catch (LineUnavailableException | IllegalStateException | SecurityException e) {
                throw busy(d, e);
            } catch (IllegalArgumentException e) {
                throw unsupported(d, f, e);
            }
            return new JavaSoundInput(line, d.name(), rateHz, channels, bits);
        }
        throw unsupported(d, format(rateHz, channels, 16), null);
    }

    private static void checkArgs(int rateHz, int channels, int bufferFrames) {
        if (rateHz <= 0) {
            throw new IllegalArgumentException("rateHz=" + rateHz + " must be > 0");
        }
        if (channels < 1) {
            throw new IllegalArgumentException("channels=" + channels + " must be >= 1");
        }
        if (bufferFrames < 1) {
            throw new IllegalArgumentException("bufferFrames=" + bufferFrames + " must be >= 1");
        }
    }

    private static Line getLine(Mixer m, DataLine.Info info, Device d, AudioFormat f) {
        try {
            return m.getLine(info);
        } catch (LineUnavailableException | SecurityException e) {
            throw busy(d, e);
        } catch (IllegalArgumentException e) {
            throw unsupported(d, f, e);
        }
    }

    private static AudioDeviceException busy(Device d, Exception e) {
        String why = e.getMessage() == null || e.getMessage().isBlank() ? "" : " (" + oneLine(e.getMessage()) + ")";
        return new AudioDeviceException(AudioDeviceException.Kind.BUSY, d.name(),
                "audio device '" + d.name() + "' could not be opened; it may be in use by another program" + why);
    }

    private static AudioDeviceException unsupported(Device d, AudioFormat f, Exception e) {
        String why = e == null || e.getMessage() == null ? "" : " (" + oneLine(e.getMessage()) + ")";
        return new AudioDeviceException(AudioDeviceException.Kind.UNSUPPORTED_FORMAT, d.name(),
                "audio device '" + d.name() + "' does not take " + (int) f.getSampleRate() + " Hz, "
                        + f.getChannels() + " channel(s), 16/24/32-bit PCM" + why);
    }

    private static String oneLine(String s) {
        return s.replaceAll("\\s+", " ").trim();
    }

    /** What both Java Sound adapters share: the line, its name and format, start, position, close. */
    private abstract static class JavaSoundLine<L extends javax.sound.sampled.DataLine> {
        final L line;
        private final String name;
        private final int rateHz;
        private final int channels;
        private final int bits;

        JavaSoundLine(L line, String name, int rateHz, int channels, int bits) {
            this.line = line;
            this.name = name;
            this.rateHz = rateHz;
            this.channels = channels;
            this.bits = bits;
        }

        public String deviceName() {
            return name;
        }

        public int sampleRateHz() {
            return rateHz;
        }

        public int channels() {
            return channels;
        }

        public int bitsPerSample() {
            return bits;
        }

        public int bufferFrames() {
            return line.getBufferSize() / line.getFormat().getFrameSize();
        }

        public void start() {
            line.start();
        }

        public long framePosition() {
            return line.getLongFramePosition();
        }

        public void close() {
            line.close();
        }
    }

    /** Adapts a SourceDataLine. */
    private static final class JavaSoundOutput extends JavaSoundLine<SourceDataLine> implements OutputLine {
        JavaSoundOutput(SourceDataLine line, String name, int rateHz, int channels, int bits) {
            super(line, name, rateHz, channels, bits);
        }

        @Override
        public int write(byte[] bytes, int offset, int length) {
            return line.write(bytes, offset, length);
        }
    }

    /** Adapts a TargetDataLine. */
    private static final class JavaSoundInput extends JavaSoundLine<TargetDataLine> implements InputLine {
        JavaSoundInput(TargetDataLine line, String name, int rateHz, int channels, int bits) {
            super(line, name, rateHz, channels, bits);
        }

        @Override
        public int read(byte[] bytes, int offset, int length) {
            return line.read(bytes, offset, length);
        }
    }
}
