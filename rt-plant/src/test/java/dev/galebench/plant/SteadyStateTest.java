package dev.galebench.plant;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.math3.complex.Complex;
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

    @ParameterizedTest(name = "wind {0} m/s, grid {1} pu, q {2} pu")
    @CsvSource({"8, 1, 0", "12, 0.8, 0.4", "12, 1.1, -0.3", "20, 0.6, 0.2"})
    void shouldSatisfyThePhasorCircuitOfTheGridConnection(double wind, double gridPu, double qPu) {
        // phasor circuit analysis with Apache Commons Math Complex, independent of the closed form
        OperatingPoint op = SteadyState.solve(p, wind, gridPu, qPu);
        GridNetwork net = new GridNetwork(p);
        double w = 2 * Math.PI * p.gridFrequencyHz;
        Complex i = new Complex(op.gridCurrentDA, op.gridCurrentQA);
        Complex e = new Complex(gridPu * PerUnitBase.gridSide(p).voltagePeakV, 0);
        Complex zDown = new Complex(net.downstreamResistanceOhm(), w * net.downstreamInductanceH());
        Complex zF = new Complex(net.chokeResistanceOhm, w * net.chokeInductanceH);
        Complex vt = e.add(zDown.multiply(i));
        Complex vc = vt.add(zF.multiply(i));
        Complex sTerm = vt.multiply(i.conjugate()).multiply(1.5);
        Complex sConv = vc.multiply(i.conjugate()).multiply(1.5);
        double tol = 1e-9 * p.ratedPowerW;
        assertEquals(op.gridPowerW, sTerm.getReal(), tol);
        assertEquals(qPu * p.ratedPowerW, sTerm.getImaginary(), tol);
        // the converter passes the generator's power (lossless converter, chopper off)
        assertEquals(op.statorPowerW, sConv.getReal(), tol);
        assertEquals(vc.getReal(), op.converterVoltageDV, 1e-9 * vc.abs());
        assertEquals(vc.getImaginary(), op.converterVoltageQV, 1e-9 * vc.abs());
        // power transfer through the downstream impedance: P_term - P_source = 1.5 R |I|^2
        Complex sSource = e.multiply(i.conjugate()).multiply(1.5);
        assertEquals(1.5 * net.downstreamResistanceOhm() * i.abs() * i.abs(), sTerm.getReal() - sSource.getReal(), tol);
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
    void shouldFindTheReactivePowerThatHoldsTheTerminalVoltageOnAWeakGrid() {
        TurbineParameters weak = p.with("grid.short_circuit_ratio", 1.5);
        // at SCR 1.5 rated power at unity power factor at the terminal has no solution
        assertThrows(IllegalArgumentException.class, () -> SteadyState.solve(weak, 12.0, 1.0, 0.0));
        OperatingPoint held = SteadyState.solveAtTerminalVoltage(weak, 12.0, 1.0, 1.0);
        assertEquals(1.0, held.terminalVoltagePu, 1e-9);
        assertEquals(held.aeroPowerW, held.pocPowerW + held.lossesW, 1e-9 * p.ratedPowerW);
        String m = assertThrows(IllegalArgumentException.class, () -> SteadyState.solveAtTerminalVoltage(p, 8.0, 0.3, 1.2)).getMessage();
        assertTrue(m.startsWith("terminal voltage:"), m);
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
