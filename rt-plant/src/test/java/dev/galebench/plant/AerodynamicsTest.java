package dev.galebench.plant;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

/** The rotor torque from the Cp surface and its low-tip-speed-ratio guard. */
class AerodynamicsTest {
    private final TurbineParameters p = TurbineFile.defaults();
    private final CpSurface cps = CpSurface.of(p);
    private final double factor = 0.5 * p.airDensityKgPerM3 * Math.PI * Math.pow(p.rotorRadiusM, 3);
    private final double r = p.rotorRadiusM;

    private double torque(double lambda, double pitchDeg, double v) {
        return TurbinePlant.aeroTorque(cps, factor, r, lambda * v / r, Math.toRadians(pitchDeg), v);
    }

    @Test
    void shouldGiveThePowerOfTheSweptAreaTimesCp() {
        // P = 1/2 rho A v^3 Cp (definition of the power coefficient)
        double v = 9.0;
        double w = 8.0 * v / r;
        double power = torque(8.0, 0.0, v) * w;
        assertEquals(0.5 * p.airDensityKgPerM3 * Math.PI * r * r * v * v * v * cps.cp(8.0, 0.0), power, 1e-9 * power);
    }

    @Test
    void shouldBeContinuousAtTheGuardAndVanishAtRestWhenFeathered() {
        for (double pitch : new double[] {0.0, 5.0, 30.0, 90.0}) {
            double below = torque(1.0 - 1e-12, pitch, 8.0);
            double at = torque(1.0, pitch, 8.0);
            assertEquals(at, below, 1e-9 * Math.abs(at) + 1e-9, "continuous at lambda = 1, pitch " + pitch);
        }
        assertTrue(cps.cp(1.0, 90.0) < 0.0, "feathered blades brake");
        assertEquals(0.0, torque(0.0, 90.0, 8.0), 0.0, "no torque at rest when feathered");
        assertTrue(torque(-0.2, 90.0, 8.0) > 0.0, "restoring for reverse rotation");
        assertTrue(torque(0.0, 0.0, 8.0) > 0.0, "starting torque at pitch 0");
        assertEquals(0.0, torque(8.0, 0.0, 0.05), 0.0, "no wind, no torque");
    }
}
