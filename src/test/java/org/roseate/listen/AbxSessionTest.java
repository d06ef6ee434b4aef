package org.roseate.listen;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.Instant;
import java.util.List;
import org.junit.jupiter.api.Test;

class AbxSessionTest {
    static final Instant T0 = Instant.parse("2026-12-02T02:00:00Z");

    @Test
    void theSeedFixesTheTrialOrder() {
        assertEquals(AbxSession.order(16, 42), AbxSession.order(16, 42));
        assertNotEquals(AbxSession.order(32, 42), AbxSession.order(32, 43));
        // Over many trials X is A about half the time: 1000 fair draws give 500 ± 3·15.8 (3σ of the binomial).
        long as = AbxSession.order(1000, 7).stream().filter(s -> s == Side.A).count();
        assertTrue(Math.abs(as - 500) < 48, "A drawn " + as + " times in 1000");
    }

    @Test
    void xResolvesToTheHiddenSideAndSwitchesAreCounted() {
        AbxSession s = new AbxSession(5, 99, T0);
        List<Side> order = AbxSession.order(5, 99);
        assertEquals(Side.A, s.select(AbxSession.Choice.A));
        assertEquals(Side.B, s.select(AbxSession.Choice.B));
        assertEquals(order.get(0), s.select(AbxSession.Choice.X));
        s.select(AbxSession.Choice.X); // no change: not a switch
        AbxTrial t = s.answer(Side.A, T0.plusSeconds(12));
        assertEquals(3, t.switches());
        assertEquals(12.0, t.seconds(), 1e-9);
        assertEquals(order.get(0), t.x());
        assertEquals(order.get(1), s.select(AbxSession.Choice.X), "X moves on with the trial");
    }

    @Test
    void noResultBeforeTheLastTrialAndNoAnswerAfterIt() {
        AbxSession s = new AbxSession(5, 1, T0);
        for (int i = 0; i < 4; i++) {
            s.answer(Side.A, T0.plusSeconds(i + 1));
            assertFalse(s.finished());
            assertThrows(IllegalStateException.class, s::outcome);
        }
        s.answer(Side.B, T0.plusSeconds(9));
        assertTrue(s.finished());
        AbxOutcome o = s.outcome();
        long correct = s.log().stream().filter(AbxTrial::correct).count();
        assertEquals(correct, o.correct());
        assertEquals(Binomial.upperTail((int) correct, 5), o.pValue(), 0.0);
        assertThrows(IllegalStateException.class, () -> s.answer(Side.A, T0));
        assertThrows(IllegalArgumentException.class, () -> new AbxSession(4, 1, T0));
    }

    @Test
    void theLogRoundTripsThroughJson() {
        AbxSession s = new AbxSession(6, 5, T0);
        for (int i = 0; i < 6; i++) {
            for (int k = 0; k < i; k++) {
                s.select(k % 2 == 0 ? AbxSession.Choice.X : AbxSession.Choice.A);
            }
            s.answer(i % 3 == 0 ? Side.B : Side.A, T0.plusMillis(1234 * (i + 1) + 7));
        }
        AbxLog log = new AbxLog("bench-pink.json", "ideal-pink", -30.0, 5, 6, s.log());
        String json = log.toJson();
        AbxLog back = AbxLog.fromJson(json);
        assertEquals(log, back);
        assertEquals(json, back.toJson());
        assertTrue(json.contains("\"pValue\""), json);
        AbxLog partial = new AbxLog("a.json", "white", -35.5, -3, 6, s.log().subList(0, 2));
        assertEquals(partial, AbxLog.fromJson(partial.toJson()));
        assertFalse(partial.toJson().contains("pValue"), "an incomplete test has no p-value");
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> AbxLog.fromJson("{\"a\":\"x\"}"));
        assertTrue(e.getMessage().contains("missing key"), e.getMessage());
    }
}
