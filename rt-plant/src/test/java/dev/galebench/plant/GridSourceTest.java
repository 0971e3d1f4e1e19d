package dev.galebench.plant;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.junit.jupiter.api.Test;

/** The programmable grid source seen at the terminal with the converters blocked (no current: terminal = source). */
class GridSourceTest {
    private final TurbineParameters p = TurbineFile.defaults();
    private final double vb = PerUnitBase.gridSide(p).voltagePeakV;

    private TurbinePlant blockedPlant(long stepNs) {
        TurbinePlant plant = new TurbinePlant(p, stepNs);
        plant.initialise(SteadyState.solve(p, 2.0, 1.0, 0.0));
        return plant;
    }

    @Test
    void shouldApplyPerPhaseMagnitudes() {
        TurbinePlant plant = blockedPlant(20_000);
        BoardCommand blocked = new BoardCommand();
        blocked.block(true);
        plant.setGridVoltagePu(0.3, 0.8, 1.1);
        double maxA = 0, maxB = 0, maxC = 0;
        double[] s = new double[plant.signalCount()];
        for (int k = 0; k < 1000; k++) { // one period at 20 us
            plant.step(blocked);
            plant.sample(s);
            // three-wire: the terminal sees the source without its zero sequence
            double zero = 0.0;
            maxA = Math.max(maxA, Math.abs(s[TurbinePlant.S_VT_A]));
            maxB = Math.max(maxB, Math.abs(s[TurbinePlant.S_VT_B]));
            maxC = Math.max(maxC, Math.abs(s[TurbinePlant.S_VT_C]));
            assertEquals(zero, s[TurbinePlant.S_VT_A] + s[TurbinePlant.S_VT_B] + s[TurbinePlant.S_VT_C], 1e-9 * vb);
        }
        // source phasors minus their zero-sequence part, computed by hand (Fortescue)
        double[] expected = phaseAmplitudesWithoutZeroSequence(0.3, 0.8, 1.1);
        assertEquals(expected[0] * vb, maxA, 1e-3 * vb);
        assertEquals(expected[1] * vb, maxB, 1e-3 * vb);
        assertEquals(expected[2] * vb, maxC, 1e-3 * vb);
    }

    private static double[] phaseAmplitudesWithoutZeroSequence(double ua, double ub, double uc) {
        double[] re = {ua, ub * Math.cos(-2 * Math.PI / 3), uc * Math.cos(2 * Math.PI / 3)};
        double[] im = {0, ub * Math.sin(-2 * Math.PI / 3), uc * Math.sin(2 * Math.PI / 3)};
        double zr = (re[0] + re[1] + re[2]) / 3, zi = (im[0] + im[1] + im[2]) / 3;
        return new double[] {Math.hypot(re[0] - zr, im[0] - zi), Math.hypot(re[1] - zr, im[1] - zi), Math.hypot(re[2] - zr, im[2] - zi)};
    }

    @Test
    void shouldJumpThePhaseAndFollowTheFrequency() {
        TurbinePlant plant = blockedPlant(50_000);
        BoardCommand blocked = new BoardCommand();
        blocked.block(true);
        plant.step(blocked);
        double[] s = new double[plant.signalCount()];
        plant.sample(s);
        double before = Math.atan2(s[TurbinePlant.S_VT_B] - s[TurbinePlant.S_VT_C], Math.sqrt(3) * s[TurbinePlant.S_VT_A]);
        double angleBefore = plant.gridAngleRad();
        plant.setGridPhaseOffsetRad(0.5);
        plant.setGridFrequencyHz(51.0);
        plant.step(blocked);
        plant.sample(s);
        double after = Math.atan2(s[TurbinePlant.S_VT_B] - s[TurbinePlant.S_VT_C], Math.sqrt(3) * s[TurbinePlant.S_VT_A]);
        double expectedStep = 0.5 + 2 * Math.PI * 51.0 * 50e-6;
        assertEquals(expectedStep, Math.IEEEremainder(after - before, 2 * Math.PI), 1e-9);
        assertEquals(expectedStep, Math.IEEEremainder(plant.gridAngleRad() - angleBefore, 2 * Math.PI), 1e-12);
        // in the frame of the true source angle the terminal voltage stays on the d axis
        assertEquals(vb, s[TurbinePlant.S_VT_D], 1e-9 * vb);
        assertEquals(0.0, s[TurbinePlant.S_VT_Q], 1e-9 * vb);
        assertEquals(51.0, s[TurbinePlant.S_FREQ], 0.0);
    }
}
