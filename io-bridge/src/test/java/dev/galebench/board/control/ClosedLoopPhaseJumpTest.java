package dev.galebench.board.control;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.galebench.board.support.ClosedLoop;
import dev.galebench.plant.SteadyState;
import dev.galebench.plant.TurbineFile;
import dev.galebench.plant.TurbineParameters;
import org.junit.jupiter.api.Test;

/** A grid phase jump and a smaller plant step, in closed loop with the real plant. */
class ClosedLoopPhaseJumpTest {
    private static final TurbineParameters TURBINE = TurbineFile.defaults();

    @Test
    void shouldRelockAfterAPhaseJumpWithoutTrip() {
        // 20 degree jump of the grid source (a common test value in grid-code compliance practice)
        final ClosedLoop cl = new ClosedLoop(TURBINE, ControllerFile.defaults(), 10.0);
        cl.run(0.2);
        cl.plant.setGridPhaseOffsetRad(Math.toRadians(20));
        final double[][] r = cl.record(0.8, 10, "v_dc_v", "p_grid_pu", "trip_flags", "i_grid_a_a", "i_grid_b_a", "i_grid_c_a");
        double peak = 0;
        for (int i = 0; i < r[0].length; i++) {
            peak = Math.max(peak, Math.max(Math.abs(r[4][i]), Math.max(Math.abs(r[5][i]), Math.abs(r[6][i]))));
        }
        System.out.printf("phase jump 20 deg: DC %.1f..%.1f V, peak phase current %.0f A (trip %.0f A), P after 0.6 s %.3f pu%n",
                ClosedLoop.min(r, 1, 0, 1), ClosedLoop.max(r, 1, 0, 1), peak, TURBINE.gscCurrentTripA,
                ClosedLoop.mean(r, 2, 0.8, 1.0));
        assertEquals(0.0, ClosedLoop.max(r, 3, 0, 1));
        assertEquals(0, cl.controller.tripCause());
        assertTrue(cl.controller.pllLocked());
        assertEquals(cl.start.gridPowerW / TURBINE.ratedPowerW, ClosedLoop.mean(r, 2, 0.8, 1.0), 0.01);
        assertTrue(ClosedLoop.max(r, 1, 0, 1) < TURBINE.dcOvervoltageTripV);
    }

    @Test
    void shouldRideThroughADipAtTwentyMicrosecondSteps() {
        final ClosedLoop cl = new ClosedLoop(TURBINE, ControllerFile.defaults(), SteadyState.solve(TURBINE, 10.0, 1.0, 0.0),
                20_000L);
        cl.run(0.2);
        cl.plant.setGridVoltagePu(0.05, 0.05, 0.05);
        final double[][] dip = cl.record(0.15, 10, "v_dc_v", "i_reactive_pu", "trip_flags");
        cl.plant.setGridVoltagePu(1, 1, 1);
        final double[][] after = cl.record(0.8, 10, "v_dc_v", "p_grid_pu", "trip_flags");
        assertEquals(0.0, ClosedLoop.max(dip, 3, 0, 2) + ClosedLoop.max(after, 3, 0, 2));
        assertTrue(ClosedLoop.mean(dip, 2, 0.3, 0.35) > 1.0, "reactive current at the limit during the dip");
        assertEquals(cl.start.gridPowerW / TURBINE.ratedPowerW, ClosedLoop.mean(after, 2, 1.05, 1.15), 0.03);
    }

    @Test
    void shouldRideThroughDipsWithASlowerExchange() {
        // exchange every 4 and 10 plant steps (200 and 500 us control periods, as over a serial
        // link) with a dip to 0.05 pu, and every 20 steps (1 ms) with a dip to 0.2 pu: the same
        // controller, re-sampled, rides through (limits in CONTROLLER.md)
        final int[] every = {4, 10, 20};
        final double[] depth = {0.05, 0.05, 0.2};
        for (int i = 0; i < every.length; i++) {
            final int m = every[i];
            final ClosedLoop cl = new ClosedLoop(TURBINE, ControllerFile.defaults(), 10.0).exchangeEvery(m);
            cl.run(0.2);
            cl.plant.setGridVoltagePu(depth[i], depth[i], depth[i]);
            final double[][] dip = cl.record(0.15, 10, "v_dc_v", "i_reactive_pu", "trip_flags");
            cl.plant.setGridVoltagePu(1, 1, 1);
            final double[][] after = cl.record(0.8, 10, "v_dc_v", "p_grid_pu", "trip_flags");
            System.out.printf("exchange every %d steps, dip to %.2f pu: DC max %.1f V, reactive in the dip %.3f pu (plant base), P after %.3f pu%n",
                    m, depth[i], Math.max(ClosedLoop.max(dip, 1, 0, 2), ClosedLoop.max(after, 1, 0, 2)),
                    ClosedLoop.mean(dip, 2, 0.3, 0.35), ClosedLoop.mean(after, 2, 1.05, 1.15));
            assertEquals(0.0, ClosedLoop.max(dip, 3, 0, 2) + ClosedLoop.max(after, 3, 0, 2), "no trip at M = " + m);
            assertTrue(ClosedLoop.mean(dip, 2, 0.3, 0.35) > 0.9, "reactive current during the dip");
            assertEquals(cl.start.gridPowerW / TURBINE.ratedPowerW, ClosedLoop.mean(after, 2, 1.05, 1.15), 0.03);
        }
    }
}
