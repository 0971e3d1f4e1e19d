package dev.galebench.cli.preflight;

import org.junit.jupiter.api.Test;

import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

class PreflightVerdictTest {

    @Test
    void shouldJudgeSustainableWhenLoopStaysWithinFloor() {
        PreflightVerdict v = PreflightVerdict.judge(5, 40_000, 5, 59_000, null, 1000);
        assertTrue(v.sustainable(), v.reasons().toString());
    }

    @Test
    void shouldRejectMoreOverrunsThanFloorStalls() {
        PreflightVerdict v = PreflightVerdict.judge(5, 40_000, 6, 40_000, null, 1000);
        assertFalse(v.sustainable());
        assertTrue(v.reasons().get(0).contains("6 > floor stalls 5"), v.reasons().toString());
    }

    @Test
    void shouldRejectLatenessTailAboveOneAndAHalfTimesFloor() {
        assertFalse(PreflightVerdict.judge(0, 40_000, 0, 60_001, null, 1000).sustainable());
        assertTrue(PreflightVerdict.judge(0, 40_000, 0, 60_000, null, 1000).sustainable());
    }

    @Test
    void shouldJudgeSubMicrosecondFloorAgainstOneMicrosecond() {
        // a quiet core: floor p99.9 of 30 ns; 1.2 us of loop lateness is still within 1.5 x 1 us
        assertTrue(PreflightVerdict.judge(0, 30, 0, 1_200, null, 1000).sustainable());
        assertFalse(PreflightVerdict.judge(0, 30, 0, 1_600, null, 1000).sustainable());
    }

    @Test
    void shouldRejectRunThatStoppedEarlyOrGotNoReplies() {
        assertFalse(PreflightVerdict.judge(0, 40_000, 0, 1_000, "ERROR boom", 1000).sustainable());
        PreflightVerdict silent = PreflightVerdict.judge(0, 40_000, 0, 1_000, null, 0);
        assertFalse(silent.sustainable());
        assertTrue(silent.reasons().contains("the board never answered"));
    }

    @Test
    void shouldStateTheLoopAgainstTheIoFloorAsRatios() {
        String line = PreflightVerdict.ioFloorComparison(750, 519_420, 402, 798, 983_550);
        assertTrue(line.contains("750 stalls (1.87 x the floor's)"), line);
        assertTrue(line.contains("p99.9 519.42 us"), line);
        assertTrue(line.contains("loop overruns 1.06 x its stalls"), line);
        assertTrue(line.contains("loop p99.9 1.89 x its p99.9"), line);
        assertTrue(PreflightVerdict.ioFloorComparison(0, 0, 0, 0, 500).contains("1.00 x its stalls"));
        assertTrue(PreflightVerdict.ioFloorComparison(0, 0, 0, 3, 500).contains("above its stalls"));
    }
}
