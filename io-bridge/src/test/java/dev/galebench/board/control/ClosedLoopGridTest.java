package dev.galebench.board.control;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.galebench.board.support.ClosedLoop;
import dev.galebench.plant.OperatingPoint;
import dev.galebench.plant.SteadyState;
import dev.galebench.plant.TurbineFile;
import dev.galebench.plant.TurbineParameters;
import org.junit.jupiter.api.Test;

/**
 * Reactive-power reference and weak-grid behaviour in closed loop with the real plant
 * (h = 50 us, exchange every step, offline).
 */
class ClosedLoopGridTest {
    private static final TurbineParameters TURBINE = TurbineFile.defaults();

    @Test
    void shouldMoveReactivePowerByTheExpectedAmountOnAVoltageDeviationReferenceStep() {
        final ControllerSettings s = ControllerFile.defaults();
        final ClosedLoop cl = new ClosedLoop(TURBINE, s, 9.0);
        final double[][] before = cl.record(0.3, 10, "q_grid_var", "i_reactive_pu", "v_term_pu");
        final double dU = 0.04;
        cl.plant.setVoltageDeviationRefPu(dU);
        final double[][] after = cl.record(0.5, 10, "q_grid_var", "i_reactive_pu", "v_term_pu");
        final double q0 = ClosedLoop.mean(before, 1, 0.2, 0.3);
        final double q1 = ClosedLoop.mean(after, 1, 0.7, 0.8);
        final double plantToConv = TURBINE.ratedPowerW / (Math.sqrt(3) * TURBINE.lvVoltageV) / TURBINE.converterRatedCurrentA;
        final double di = (ClosedLoop.mean(after, 2, 0.7, 0.8) - ClosedLoop.mean(before, 2, 0.2, 0.3)) * plantToConv;
        final double du = ClosedLoop.mean(after, 3, 0.7, 0.8) - ClosedLoop.mean(before, 3, 0.2, 0.3);
        // proportional loop i_r = K_v (dU_ref - du); with the grid's Thevenin reactance beyond the terminal
        // (X, converter pu) du = X i_r, so i_r = K_v dU_ref / (1 + K_v X) [D], X from the same series
        // impedances the plant uses (REFERENCES.md 9: transformers u_k, grid from SCR).
        final ControllerTuning t = ControllerTuning.derive(TURBINE, s);
        final double zBaseConv = t.gridVoltageBaseV / t.gridCurrentBaseA;
        final double x = t.gridOmegaRadPerS * t.beyondTerminalInductanceH / zBaseConv;
        final double expected = s.voltageLoopGainPu * dU / (1 + s.voltageLoopGainPu * x);
        System.out.printf("dU_ref step %.3f pu: reactive current %+.4f pu (expected %+.4f), terminal voltage %+.4f pu, Q %+.0f var%n",
                dU, di, expected, du, q1 - q0);
        assertTrue(q1 - q0 > 0, "more (capacitive) reactive power for a positive deviation reference");
        assertEquals(expected, di, 0.1 * expected);
        assertEquals(s.voltageLoopGainPu * (dU - du), di, 0.05 * expected, "the loop law itself");
    }

    /** The steady state at {@code scr} whose reactive power holds the terminal at 1.0 pu. */
    private static OperatingPoint supportedPoint(TurbineParameters p, double wind) {
        OperatingPoint best = null;
        for (double q = 0; q <= 1.0; q += 0.01) {
            try {
                final OperatingPoint op = SteadyState.solve(p, wind, 1.0, q);
                if (best == null || Math.abs(op.terminalVoltagePu - 1.0) < Math.abs(best.terminalVoltagePu - 1.0)) {
                    best = op;
                }
            } catch (IllegalArgumentException notCarried) {
                // this much reactive power does not solve; try the next
            }
        }
        return best;
    }

    @Test
    void shouldStayStableAtRatedPowerOnAWeakGrid() {
        // SCR 1.5, X/R 10 (IEEE Std 1204-1997: very weak below 2, from memory). At rated power the
        // grid cannot carry the power at unity power factor; the plant-level controller asks for
        // the reactive support that holds 1.0 pu (here via the deviation reference).
        final TurbineParameters weak = TURBINE.with("grid.short_circuit_ratio", 1.5).with("grid.x_over_r", 10.0);
        final OperatingPoint op = supportedPoint(weak, 12.0);
        final ClosedLoop cl = new ClosedLoop(weak, ControllerFile.defaults(), op, 50_000L);
        cl.run(0.5);
        // disturbances: a 5 % drop of the grid source, then back
        cl.plant.setGridVoltagePu(0.95, 0.95, 0.95);
        final double[][] r1 = cl.record(1.0, 10, "v_dc_v", "p_grid_pu", "v_term_pu", "trip_flags");
        cl.plant.setGridVoltagePu(1.0, 1.0, 1.0);
        final double[][] r2 = cl.record(2.0, 10, "v_dc_v", "p_grid_pu", "v_term_pu", "trip_flags");
        System.out.printf("weak grid SCR 1.5: P %.3f pu, terminal %.3f pu; after the disturbances DC %.1f..%.1f V, P %.3f..%.3f%n",
                op.gridPowerW / TURBINE.ratedPowerW, op.terminalVoltagePu, ClosedLoop.min(r2, 1, 2.5, 3.5),
                ClosedLoop.max(r2, 1, 2.5, 3.5), ClosedLoop.min(r2, 2, 2.5, 3.5), ClosedLoop.max(r2, 2, 2.5, 3.5));
        assertEquals(0.0, ClosedLoop.max(r1, 4, 0, 10) + ClosedLoop.max(r2, 4, 0, 10), "no trip");
        // settled: in the last second DC within 0.5 %, power within 1 % of rated and not oscillating
        assertTrue(ClosedLoop.max(r2, 1, 2.5, 3.5) - ClosedLoop.min(r2, 1, 2.5, 3.5) < 0.005 * 1100);
        assertTrue(ClosedLoop.max(r2, 2, 2.5, 3.5) - ClosedLoop.min(r2, 2, 2.5, 3.5) < 0.01);
        assertEquals(op.gridPowerW / TURBINE.ratedPowerW, ClosedLoop.mean(r2, 2, 3.0, 3.5), 0.01);
    }

    @Test
    void shouldStaySettledWhenTheGridWeakensToScrTwoAtRatedPowerWithoutRetuning() {
        // documented limit: tuned for the file's SCR 10, the controller stays settled when the grid
        // drops to SCR 2 (X/R 10) at rated power, the proportional voltage loop lifting the
        // sagging terminal voltage; at SCR 1.5 and rated power it needs the weak grid in its
        // tuning and the plant-level reactive support (test above)
        final ClosedLoop cl = new ClosedLoop(TURBINE, ControllerFile.defaults(), 12.0);
        cl.run(0.2);
        cl.plant.setGridStrength(2.0, 10.0);
        final double[][] r = cl.record(4.0, 10, "v_dc_v", "p_grid_pu", "v_term_pu", "trip_flags", "q_grid_pu");
        System.out.printf("grid weakened to SCR 2 at rated: P %.3f..%.3f, Q %.3f, terminal %.3f pu, DC %.1f..%.1f V%n",
                ClosedLoop.min(r, 2, 3, 4.3), ClosedLoop.max(r, 2, 3, 4.3), ClosedLoop.mean(r, 5, 3, 4.3),
                ClosedLoop.mean(r, 3, 3, 4.3), ClosedLoop.min(r, 1, 3, 4.3), ClosedLoop.max(r, 1, 3, 4.3));
        assertEquals(0.0, ClosedLoop.max(r, 4, 0, 5));
        assertTrue(ClosedLoop.max(r, 1, 3, 4.3) - ClosedLoop.min(r, 1, 3, 4.3) < 0.005 * 1100);
        assertTrue(ClosedLoop.max(r, 2, 3, 4.3) - ClosedLoop.min(r, 2, 3, 4.3) < 0.01);
        assertTrue(ClosedLoop.mean(r, 5, 3, 4.3) > 0.05, "voltage support");
        assertTrue(!cl.controller.frtActive());
    }
}
