package dev.galebench.board.control;

import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

class FrtSupervisorTest {
    private static final double TS = 1e-3;

    @Test
    void shouldEnterAboveThresholdAndLeaveOnlyAfterHoldBelowLowerThreshold() {
        final FrtSupervisor f = new FrtSupervisor();
        f.configure(0.10, 0.08, 0.1);
        assertFalse(f.step(-0.095, TS), "inside the dead band");
        assertTrue(f.step(-0.11, TS), "dip beyond 0.1 pu");
        // between exit and entry threshold: stays active indefinitely (hysteresis)
        for (int i = 0; i < 1000; i++) {
            assertTrue(f.step(-0.09, TS));
        }
        // below the exit threshold: stays active for the hold time, then leaves
        for (int i = 0; i < 99; i++) {
            assertTrue(f.step(-0.05, TS));
        }
        // a short excursion restarts the hold
        assertTrue(f.step(-0.09, TS));
        for (int i = 0; i < 99; i++) {
            assertTrue(f.step(0.0, TS));
        }
        f.step(0.0, TS);
        f.step(0.0, TS);
        assertFalse(f.active(), "left after the hold time");
    }

    @Test
    void shouldTreatSwellsLikeDips() {
        final FrtSupervisor f = new FrtSupervisor();
        f.configure(0.10, 0.08, 0.0);
        assertTrue(f.step(0.2, TS));
        assertFalse(f.step(0.05, TS));
    }
}
