package org.roseate.app;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.ExtendWith;
import org.testfx.framework.junit5.ApplicationExtension;

@ExtendWith({HeadlessFx.class, ApplicationExtension.class})
class LogAxisTest {
    @Test
    void majorTicksFollowTheOneTwoFiveSequence() {
        // common practice: audio log axes tick at 1-2-5 of each decade; 20 Hz … 20 kHz spans three decades
        List<Number> t = LogAxis.ticks(20, 20000, new double[] {1, 2, 5});
        assertEquals(List.of(20.0, 50.0, 100.0, 200.0, 500.0, 1000.0, 2000.0, 5000.0, 10000.0, 20000.0),
                t.stream().map(n -> (double) Math.round(n.doubleValue() * 1e6) / 1e6).toList());
    }

    @Test
    void labelsUseKilohertzFromOneThousand() {
        assertEquals("20", LogAxis.label(20));
        assertEquals("500", LogAxis.label(500));
        assertEquals("1k", LogAxis.label(1000));
        assertEquals("2k", LogAxis.label(2000.0000001));
        assertEquals("20k", LogAxis.label(20000));
        assertEquals("0.5", LogAxis.label(0.5));
    }

    @Test
    void positionIsLinearInLogFrequency() {
        LogAxis a = new LogAxis("f", 10, 10000);
        a.resize(300, 30);
        // three decades on 300 px: 100 px per decade (log10 closed form)
        assertEquals(0, a.getDisplayPosition(10), 1e-9);
        assertEquals(100, a.getDisplayPosition(100), 1e-9);
        assertEquals(300 * Math.log10(2000 / 10.0) / 3, a.getDisplayPosition(2000), 1e-9);
        assertEquals(1000, a.getValueForDisplay(200).doubleValue(), 1e-9);
    }

    @Test
    void badBoundsAreRefused() {
        assertThrows(IllegalArgumentException.class, () -> new LogAxis("f", 0, 100));
        assertThrows(IllegalArgumentException.class, () -> new LogAxis("f", 100, 100));
    }
}
