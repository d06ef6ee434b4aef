package org.roseate.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.condition.EnabledIfEnvironmentVariable;
import org.roseate.audio.Devices;

class DevicesCommandTest {
    @Test
    void listsWhatJavaSoundOffersOrSaysThereIsNothing() {
        AnalyzeCommandTest.Run r = AnalyzeCommandTest.run("devices");
        if (Devices.list().isEmpty()) {
            assertEquals(3, r.status(), r.err());
            assertTrue(r.err().contains("no audio devices found"), r.err());
        } else {
            assertEquals(0, r.status(), r.err());
            assertTrue(r.out().contains("Output devices"), r.out());
            assertTrue(r.out().contains("Input devices"), r.out());
        }
    }

    @Test
    void formatsAreGroupedByRate() {
        assertEquals("44100 Hz (1/2 ch), 48000 Hz (2 ch)", DevicesCommand.formats(List.of(
                new Devices.Probe(44100, 1), new Devices.Probe(44100, 2), new Devices.Probe(48000, 2))));
        assertEquals("none of the probed formats", DevicesCommand.formats(List.of()));
    }

    @Test
    @EnabledIfEnvironmentVariable(named = "ROSEATE_VIRTUAL_SOUNDCARD", matches = "1")
    void theVirtualCardIsTheDefaultBothWaysAndTakes48kStereo() {
        AnalyzeCommandTest.Run r = AnalyzeCommandTest.run("devices");
        assertEquals(0, r.status(), r.err());
        String[] sections = r.out().split("Input devices");
        for (String s : sections) {
            assertTrue(s.contains("*[0] default [default]"), s);
            assertTrue(s.contains("48000 Hz (1/2 ch)"), s);
        }
    }
}
