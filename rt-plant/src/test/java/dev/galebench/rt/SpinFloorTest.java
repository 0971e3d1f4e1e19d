package dev.galebench.rt;

import org.junit.jupiter.api.Test;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

class SpinFloorTest {

    @Test
    void shouldRecordOneLatenessPerTickAndCountStallsConsistently() throws Exception {
        SpinFloor.Result r = SpinFloor.measure(50_000, 200_000_000, -1);
        assertEquals(4000, r.ticks());
        assertEquals(4000, r.latenessNs().getTotalCount());
        // a tick late by more than a step needs a clock gap behind it; one gap may make several stalls
        assertTrue(r.stalls() == 0 || r.clockGaps() >= 1, r.toString());
        assertTrue(r.stalls() <= r.ticks());
        // lateness comes from clock gaps: back-to-back gaps add up (the ticks behind them are late
        // by their sum), so the largest lateness is at most all the gaps together (+1 % histogram
        // precision, + one step)
        final long maxLatenessNs = r.latenessNs().getMaxValue();
        assertTrue(r.stalls() == 0
                        || maxLatenessNs - maxLatenessNs / 100 - 50_000 <= r.clockGaps() * r.maxClockGapNs(),
                "the lateness is explained by the clock gaps: " + r);
    }

    @Test
    void shouldRejectDurationShorterThanOneStep() {
        assertThrows(IllegalArgumentException.class, () -> SpinFloor.measure(50_000, 10_000, -1));
    }
}
