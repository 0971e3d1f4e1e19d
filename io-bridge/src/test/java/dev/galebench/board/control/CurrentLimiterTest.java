package dev.galebench.board.control;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

class CurrentLimiterTest {
    private final CurrentLimiter lim = new CurrentLimiter();

    @Test
    void shouldGiveActiveCurrentPriorityInNormalOperation() {
        // IEC 61400-27-1 limiter, M_qpri = 0 (REFERENCES.md 6c/7): i_d first, i_q gets sqrt(I^2 - i_d^2)
        lim.limit(0.9, -0.8, 1.0, false, 10.0);
        assertEquals(0.9, lim.idPu, 1e-12);
        assertEquals(-Math.sqrt(1 - 0.81), lim.iqPu, 1e-12);
        assertTrue(lim.qClipped);
        assertFalse(lim.dClipped);
    }

    @Test
    void shouldGiveReactiveCurrentPriorityDuringFrt() {
        lim.limit(0.9, -1.0, 1.1, true, 10.0);
        assertEquals(-1.0, lim.iqPu, 1e-12);
        assertEquals(Math.sqrt(1.21 - 1.0), lim.idPu, 1e-12);
        assertTrue(lim.dClipped);
        lim.limit(0.2, -1.5, 1.1, true, 10.0);
        assertEquals(-1.1, lim.iqPu, 1e-12);
        assertEquals(0.0, lim.idPu, 1e-12);
    }

    @Test
    void shouldNeverExceedTheTotalLimitAndHonourTheActiveCap() {
        for (double d = -2; d <= 2; d += 0.1) {
            for (double q = -2; q <= 2; q += 0.1) {
                lim.limit(d, q, 1.1, d > 0, 0.5);
                assertTrue(Math.hypot(lim.idPu, lim.iqPu) <= 1.1 + 1e-12);
                assertTrue(Math.abs(lim.idPu) <= 0.5 + 1e-12);
            }
        }
    }
}
