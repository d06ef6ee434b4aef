package org.roseate.app;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.roseate.bands.BandFraction;
import org.roseate.bands.BandTable;
import org.roseate.noise.ChainSettings;
import org.roseate.noise.NoiseChain;
import org.roseate.spectrum.BandLevel;

class BandMeterTest {
    @Test
    void theMeterOfWhiteNoiseReadsTheBandShareOfItsLevel() throws Exception {
        double rate = 48000;
        double levelDbfs = -20;
        NoiseChain white = NoiseChain.white(new ChainSettings(rate, 2, false, 7L, levelDbfs));
        MeterRing ring = new MeterRing(1 << 16);
        ring.setActiveTap(1);
        TapSource tap = new TapSource(white, ring, 1);
        TapSource idle = new TapSource(NoiseChain.white(new ChainSettings(rate, 2, false, 8L, 0)), ring, 2);
        BandTable table = BandTable.of(BandFraction.THIRD_OCTAVE, 100, 16000);
        double[] block = new double[2 * 333]; // an odd block size, as the render thread may use
        BandMeter.Snapshot s;
        try (BandMeter meter = new BandMeter(ring, rate, table).start()) {
            long deadline = System.nanoTime() + 20_000_000_000L;
            do {
                tap.render(block, 333);
                idle.render(block, 333); // not the active tap: must not reach the meter
                Thread.sleep(1); // about 7× real time: the meter keeps up, nothing is dropped
                s = meter.latest();
            } while ((s == null || s.averages() < 40) && System.nanoTime() < deadline);
        }
        assertNotNull(s);
        assertTrue(s.averages() >= 40, "averages " + s.averages());
        for (BandLevel b : s.levels()) {
            // closed form: white noise of mean square ms has density ms/(fs/2), so a band of width B
            // holds ms·2B/fs and reads L + 10·log10(2B/fs) dBFS (AES17 dBFS, as DensityUnit documents)
            double expected = levelDbfs + 10 * Math.log10(2 * b.band().widthHz() / rate);
            // 4 standard deviations of the reported random error (exponential averaging), plus
            // 0.05 dB for the Hann window's bin sharing at the band edges
            assertEquals(expected, b.levelDb(), 4 * b.uncertaintyDb() + 0.05, b.band().label());
        }
    }

    @Test
    void theRingDropsRatherThanWaits() {
        MeterRing ring = new MeterRing(16);
        double[] x = new double[40];
        ring.write(x, 10, 1, 0);
        ring.write(x, 10, 1, 0); // does not fit in the 6 free samples
        assertEquals(10, ring.written());
        assertEquals(10, ring.dropped());
        assertEquals(10, ring.read(new double[64], 64));
    }
}
