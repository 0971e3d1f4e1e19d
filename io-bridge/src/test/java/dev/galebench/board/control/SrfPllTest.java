package dev.galebench.board.control;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

class SrfPllTest {
    private static final double TS = 50e-6;
    private static final double VPK = 563.4;

    private static SrfPll pll() {
        final SrfPll p = new SrfPll();
        final double wn = 2 * Math.PI * 8;
        p.configure(SrfPll.kpFor(wn, 0.707), SrfPll.kiFor(wn), 50.0, 0.2 * VPK, TS);
        return p;
    }

    /** Runs the PLL on a synthesised balanced set; returns the final angle error (rad). */
    private static double run(SrfPll p, double[] thetaState, double freqHz, double seconds, double amplitude) {
        final int n = (int) Math.round(seconds / TS);
        double err = 0;
        for (int k = 0; k < n; k++) {
            thetaState[0] += 2 * Math.PI * freqHz * TS;
            final double th = thetaState[0];
            final double a = amplitude * Math.cos(th);
            final double b = amplitude * Math.cos(th - 2 * Math.PI / 3);
            final double c = amplitude * Math.cos(th + 2 * Math.PI / 3);
            p.step(Transforms.alpha(a, b, c), Transforms.beta(b, c));
            // after step, the PLL angle is its estimate for the next sample
            err = Transforms.wrapPi(p.angleRad() - (th + 2 * Math.PI * freqHz * TS));
        }
        return err;
    }

    @Test
    void shouldLockFromAWrongStartAngle() {
        final SrfPll p = pll();
        p.start(VPK, 0.0); // claims angle 0
        final double[] th = {1.0}; // true angle 1 rad
        final double err = run(p, th, 50.0, 0.3, VPK);
        assertEquals(0.0, err, 1e-3);
        assertEquals(50.0, p.frequencyHz(), 1e-3);
        assertTrue(p.locked());
    }

    @Test
    void shouldRelockAfterAPhaseJumpWithinTheDesignSettlingTime() {
        // Kaura & Blasko 1997 / REFERENCES.md 4: t_s(1 %) = 4.6/(zeta wn) = 4.6/(0.707 * 2 pi 8) = 129 ms
        final SrfPll p = pll();
        final double[] th = {0.3};
        p.start(VPK * Math.cos(0.3), VPK * Math.sin(0.3));
        run(p, th, 50.0, 0.1, VPK);
        th[0] += Math.toRadians(30); // 30 degree jump
        final double errRightAfter = run(p, th, 50.0, 0.001, VPK);
        assertTrue(Math.abs(errRightAfter) > Math.toRadians(20));
        final double err = run(p, th, 50.0, 0.129, VPK);
        assertTrue(Math.abs(err) < 0.01 * Math.toRadians(30) * 3, "error after t_s: " + err);
        final double errLate = run(p, th, 50.0, 0.2, VPK);
        assertEquals(0.0, errLate, 1e-4);
    }

    @Test
    void shouldTrackAFrequencyStep() {
        final SrfPll p = pll();
        p.start(VPK, 0.0);
        final double[] th = {0.0};
        run(p, th, 50.0, 0.1, VPK);
        final double err = run(p, th, 51.0, 0.5, VPK);
        assertEquals(51.0, p.frequencyHz(), 1e-3);
        assertEquals(0.0, err, 1e-3); // type-2 loop: no steady angle error for a frequency step
    }

    @Test
    void shouldKeepGainsIndependentOfVoltageAboveTheFloor() {
        final SrfPll full = pll();
        final SrfPll half = pll();
        full.start(VPK, 0);
        half.start(0.5 * VPK, 0);
        final double[] a = {0.2};
        final double[] b = {0.2};
        final double e1 = run(full, a, 50.0, 0.02, VPK);
        final double e2 = run(half, b, 50.0, 0.02, 0.5 * VPK);
        assertEquals(e1, e2, 1e-3);
    }
}
