package org.roseate.app;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;

/**
 * The design the window opens on: {@code presets/bench-pink.json} from the working directory when
 * it is there, else an embedded copy of the same bench pink source.
 */
final class DefaultDesign {
    /** Where the bundled preset lives, relative to the working directory. */
    static final Path PRESET = Path.of("presets", "bench-pink.json");

    /** The embedded copy: a three-branch inverting pink filter, E24 resistors and E12 capacitors. */
    static final String TEXT = """
            {
              "name": "Bench pink source",
              "description": "Three-branch inverting pink filter for loudspeaker and room checks on the bench: white noise in, pink out across 20 Hz-20 kHz. E24 resistors, E12 film capacitors, a 3 MHz op-amp.",
              "tolerance": { "R": "1%", "C": "5%" },
              "stages": [
                {
                  "kind": "inverting",
                  "input": "R1(47k)",
                  "feedback": "R2(240k) || C1(1n) || (R3(150k) + C2(12n)) || (R4(56k) + C3(3n9)) || (R5(20k) + C4(1n5))",
                  "opamp": { "gbwHz": 3e6, "openLoopGain": 2e5 }
                }
              ]
            }
            """;

    private DefaultDesign() {
    }

    /** The preset file under {@code workingDir}, if it is a readable file. */
    static Path presetIn(Path workingDir) {
        Path p = workingDir.resolve(PRESET);
        return Files.isRegularFile(p) && Files.isReadable(p) ? p : null;
    }

    static String read(Path file) throws IOException {
        return Files.readString(file);
    }
}
