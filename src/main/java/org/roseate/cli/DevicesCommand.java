package org.roseate.cli;

import java.io.PrintWriter;
import java.util.List;
import java.util.concurrent.Callable;
import org.roseate.audio.Devices;
import picocli.CommandLine.Command;
import picocli.CommandLine.Spec;

/** {@code devices}: the sound devices, their indexes and the 16-bit formats they take. */
@Command(name = "devices", mixinStandardHelpOptions = true,
        description = "List audio output and input devices with index numbers, default marks and supported rates "
                + "(16-bit, probed at 44100/48000/96000/192000 Hz, mono and stereo).")
final class DevicesCommand implements Callable<Integer> {
    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() {
        List<Devices.Device> all = Devices.list();
        if (all.isEmpty()) {
            throw new DeviceException("no audio devices found (Java Sound lists none); check that a sound card or "
                    + "sound server is present, or write a file instead with 'roseate render DESIGN.json -o out.wav'");
        }
        PrintWriter out = spec.commandLine().getOut();
        section(out, "Output devices (play --device NAME|INDEX):", all, true);
        out.println();
        section(out, "Input devices (--input-device NAME|INDEX):", all, false);
        out.println();
        out.println("* = default. Rates are those the device accepts at 16 bits; 1 = mono, 2 = stereo.");
        out.flush();
        return 0;
    }

    private static void section(PrintWriter out, String title, List<Devices.Device> all, boolean output) {
        out.println(title);
        boolean any = false;
        for (Devices.Device d : all) {
            if (output ? !d.hasOutput() : !d.hasInput()) {
                continue;
            }
            any = true;
            boolean def = output ? d.defaultOutput() : d.defaultInput();
            out.println(Numbers.f("  %s[%d] %s — %s", def ? "*" : " ", d.index(), d.name(), d.description()));
            out.println("        " + formats(output ? d.outputs() : d.inputs()));
        }
        if (!any) {
            out.println("  none");
        }
    }

    static String formats(List<Devices.Probe> probes) {
        if (probes.isEmpty()) {
            return "none of the probed formats";
        }
        StringBuilder sb = new StringBuilder();
        for (int rate : Devices.PROBE_RATES_HZ) {
            StringBuilder ch = new StringBuilder();
            for (Devices.Probe p : probes) {
                if (p.sampleRateHz() == rate) {
                    ch.append(ch.length() == 0 ? "" : "/").append(p.channels());
                }
            }
            if (ch.length() > 0) {
                sb.append(sb.length() == 0 ? "" : ", ").append(rate).append(" Hz (").append(ch).append(" ch)");
            }
        }
        return sb.toString();
    }
}
