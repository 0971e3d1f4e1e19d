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
    void shouldDoTheFloorIoOncePerTickInTickOrderAndPollWhileSpinning() throws Exception {
        final long[] ticks = new long[1];
        final long[] polls = new long[1];
        final long[] lastTick = {-1};
        final boolean[] ordered = {true};
        SpinFloor.FloorIo io = new SpinFloor.FloorIo() {
            @Override
            public void onTick(long k) {
                if (k != lastTick[0] + 1) {
                    ordered[0] = false;
                }
                lastTick[0] = k;
                ticks[0]++;
            }

            @Override
            public void poll() {
                polls[0]++;
            }
        };
        SpinFloor.Result r = SpinFloor.measure(100_000, 100_000_000, -1, io);
        assertEquals(1000, r.ticks());
        assertEquals(1000, ticks[0], "one send per tick");
        assertTrue(ordered[0], "ticks handed over in order, none skipped");
        // 100 us steps leave 97 us of each one for polling; even a machine losing half its time polls often
        assertTrue(polls[0] > r.ticks(), "polled while spinning: " + polls[0]);
    }

    @Test
    void shouldRejectDurationShorterThanOneStep() {
        assertThrows(IllegalArgumentException.class, () -> SpinFloor.measure(50_000, 10_000, -1));
    }
}
