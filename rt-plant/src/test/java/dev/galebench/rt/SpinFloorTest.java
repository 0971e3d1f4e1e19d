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
        assertTrue(r.maxClockGapNs() >= r.latenessNs().getMaxValue() - r.latenessNs().getMaxValue() / 100 - 1000
                || r.stalls() == 0, "the largest lateness comes from the largest gap: " + r);
    }

    @Test
    void shouldRejectDurationShorterThanOneStep() {
        assertThrows(IllegalArgumentException.class, () -> SpinFloor.measure(50_000, 10_000, -1));
    }
}
