package dev.galebench.plant;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

class SteadyStateTest {
    private final TurbineParameters p = TurbineFile.defaults();

    @ParameterizedTest(name = "wind {0} m/s, grid {1} pu, q {2} pu")
    @CsvSource({"2, 1, 0", "4, 1, 0", "7, 1, 0.3", "10, 0.9, -0.3", "10.85, 1, 0", "15, 1.05, 0.2", "24, 0.8, 0.2", "30, 1, 0", "6, 0.3, 0.1"})
    void shouldBalancePowerFromRotorToPointOfConnection(double wind, double gridPu, double qPu) {
        OperatingPoint op = SteadyState.solve(p, wind, gridPu, qPu);
        // energy conservation: mechanical = electrical at the point of connection + losses
        assertEquals(op.aeroPowerW, op.pocPowerW + op.lossesW, 1e-9 * p.ratedPowerW);
        // generator: T_e * w_m = P_stator + copper loss (Krause et al., Analysis of Electric
        // Machinery, PMSM torque 1.5 p (psi i_q + (Ld - Lq) i_d i_q), from memory)
        assertEquals(op.generatorTorqueNm * op.generatorSpeedRadPerS, op.statorPowerW + op.statorCopperLossW, 1e-9 * p.ratedPowerW);
        // reactive power asked for at the terminal
        assertEquals(qPu * p.ratedPowerW, op.gridReactivePowerVar, 1e-6 * p.ratedPowerW);
        assertEquals(p.dcVoltageNominalV, op.dcLinkVoltageV, 0.0);
    }

    @Test
    void shouldFollowTheRegionsOfTheOperatingCurve() {
        assertEquals("idle", SteadyState.solve(p, 2.0, 1, 0).region);
        assertEquals("min-speed", SteadyState.solve(p, 4.0, 1, 0).region);
        assertEquals("mppt", SteadyState.solve(p, 8.0, 1, 0).region);
        OperatingPoint rated = SteadyState.solve(p, 14.0, 1, 0);
        assertEquals("pitch", rated.region);
        assertEquals(p.ratedPowerW, rated.aeroPowerW, 1e-6 * p.ratedPowerW);
        assertEquals(p.ratedRotorSpeedRadPerS, rated.rotorSpeedRadPerS, 0.0);
        assertTrue(rated.pitchDeg() > 0.5);
        assertEquals("idle", SteadyState.solve(p, 26.0, 1, 0).region);
    }

    @Test
    void shouldHoldTheOptimalTipSpeedRatioInMppt() {
        // MPPT optimal-torque law k_opt w^2 (REFERENCES.md 2): without friction the equilibrium is lambda_opt
        TurbineParameters noFriction = p.with("drivetrain.friction_nms_rad", 0.0);
        OperatingPoint op = SteadyState.solve(noFriction, 8.0, 1, 0);
        CpSurface cps = CpSurface.of(p);
        assertEquals(cps.optimalTipSpeedRatio(), op.tipSpeedRatio, 1e-6);
        assertEquals(cps.maxCp(), op.cp, 1e-9);
    }

    @Test
    void shouldRejectBadInputWithAClearMessage() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> SteadyState.solve(p, -1, 1, 0));
        assertTrue(e.getMessage().startsWith("wind:"), e.getMessage());
        assertThrows(IllegalArgumentException.class, () -> SteadyState.solve(p, 8, 0.0, 0));
        assertThrows(IllegalArgumentException.class, () -> SteadyState.solve(p, 8, 1, Double.NaN));
        // full power and 0.5 pu capacitive Q through 0.25 pu of reactance at half voltage has no solution
        String m = assertThrows(IllegalArgumentException.class, () -> SteadyState.solve(p, 24, 0.5, 0.5)).getMessage();
        assertTrue(m.startsWith("grid: the network cannot carry"), m);
    }
}
