package dev.galebench.board.control;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

/**
 * Sequence separation against sets built from known sequences (the Fortescue definition):
 * {@code x = X+ e^{j theta} + X- e^{-j theta}} in alpha-beta, with theta the exact grid angle.
 */
class DdsrfTest {
    private static final double W = 2 * Math.PI * 50;
    private static final double TS = 50e-6;

    /** Runs {@code seconds} of the set with positive (d, q) and negative (d, q) components; returns the DDSRF. */
    private static Ddsrf run(double pd, double pq, double nd, double nq, double seconds) {
        final Ddsrf f = new Ddsrf();
        f.configure(Ddsrf.filterTimeConstantS(W), TS);
        f.start(pd, pq, 1, 0);
        final int n = (int) Math.round(seconds / TS);
        for (int k = 1; k <= n; k++) {
            final double th = W * k * TS;
            final double c = Math.cos(th);
            final double s = Math.sin(th);
            final double alpha = Transforms.alphaOf(pd, pq, c, s) + Ddsrf.negAlpha(nd, nq, c, s);
            final double beta = Transforms.betaOf(pd, pq, c, s) + Ddsrf.negBeta(nd, nq, c, s);
            f.step(alpha, beta, c, s);
        }
        return f;
    }

    @Test
    void shouldSeparateBothSequencesOfAnUnbalancedSet() {
        // phase a to 0.3 of a 1.0 set: X+ = 0.767, X- = 0.233 (Fortescue); here with arbitrary angles
        final Ddsrf f = run(0.767, 0.05, 0.2, -0.12, 0.1);
        assertEquals(0.767, f.posDBar(), 1e-4);
        assertEquals(0.05, f.posQBar(), 1e-4);
        assertEquals(0.2, f.negDBar(), 1e-4);
        assertEquals(-0.12, f.negQBar(), 1e-4);
        // the decoupled positive sequence has no 2f ripple left
        assertEquals(0.767, f.posD, 1e-4);
        assertEquals(0.05, f.posQ, 1e-4);
    }

    @Test
    void shouldSeeNoNegativeSequenceOnABalancedSet() {
        final Ddsrf f = run(1.0, 0.0, 0.0, 0.0, 0.05);
        assertEquals(0.0, f.negDBar(), 1e-12);
        assertEquals(0.0, f.negQBar(), 1e-12);
        assertEquals(1.0, f.posD, 1e-12);
        assertTrue(Math.abs(f.posQ) < 1e-12);
    }

    @Test
    void shouldSettleWithinTwoCyclesAfterAnUnbalancedStep() {
        // Rodriguez et al. 2007 report about one cycle for the DDSRF (from memory); asserted: 2 % in 40 ms
        final Ddsrf f = run(0.767, 0.0, 0.233, 0.0, 0.04);
        assertEquals(0.233, Math.hypot(f.negDBar(), f.negQBar()), 0.02 * 0.233 + 0.005);
        assertEquals(0.767, Math.hypot(f.posDBar(), f.posQBar()), 0.02 * 0.767);
    }
}
