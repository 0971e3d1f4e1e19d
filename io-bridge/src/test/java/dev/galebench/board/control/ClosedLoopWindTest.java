package dev.galebench.board.control;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.galebench.board.support.ClosedLoop;
import dev.galebench.plant.CpSurface;
import dev.galebench.plant.OperatingPoint;
import dev.galebench.plant.SteadyState;
import dev.galebench.plant.TurbineFile;
import dev.galebench.plant.TurbineParameters;
import org.junit.jupiter.api.Test;

/** Wind steps in closed loop with the real plant (default turbine, h = 50 us, offline). */
class ClosedLoopWindTest {
    private static final TurbineParameters TURBINE = TurbineFile.defaults();

    @Test
    void shouldSettleAtTheAerodynamicOptimumAfterAWindStepBelowRated() {
        final ClosedLoop cl = new ClosedLoop(TURBINE, ControllerFile.defaults(), 7.0);
        cl.run(0.5);
        cl.plant.setWindSpeed(8.0);
        final long wall0 = System.nanoTime();
        final double[][] r = cl.record(60.0, 200, "v_dc_v", "p_grid_w", "p_aero_w", "cp", "tip_speed_ratio");
        // timing report only (not asserted): simulated time over wall time of this offline run
        System.out.printf("offline closed loop: 60 s simulated in %.2f s wall (%.0fx real time, includes JIT warm-up)%n",
                (System.nanoTime() - wall0) * 1e-9, 60.0 / ((System.nanoTime() - wall0) * 1e-9));
        final CpSurface cps = CpSurface.of(TURBINE);
        // the optimum at 8 m/s: P = 1/2 rho pi R^2 Cp_max v^3 (REFERENCES.md 2)
        final double pOpt = 0.5 * TURBINE.airDensityKgPerM3 * Math.PI * TURBINE.rotorRadiusM * TURBINE.rotorRadiusM
                * 512.0 * cps.maxCp();
        final OperatingPoint expected = SteadyState.solve(TURBINE, 8.0, 1.0, 0.0);
        final double pAero = ClosedLoop.mean(r, 3, 55, 60.5);
        final double pGrid = ClosedLoop.mean(r, 2, 55, 60.5);
        final double dcMin = ClosedLoop.min(r, 1, 0, 61);
        final double dcMax = ClosedLoop.max(r, 1, 0, 61);
        System.out.printf("wind 7 -> 8 m/s: P_aero %.0f W (optimum %.0f, Cp %.4f of %.4f), P_grid %.0f W (steady state %.0f), DC %.1f..%.1f V%n",
                pAero, pOpt, ClosedLoop.mean(r, 4, 55, 60.5), cps.maxCp(), pGrid, expected.gridPowerW, dcMin, dcMax);
        // tolerance: 1 % of the optimum (MPPT on k_opt w^2 converges to lambda_opt)
        assertEquals(pOpt, pAero, 0.01 * pOpt);
        assertEquals(expected.gridPowerW, pGrid, 0.01 * expected.gridPowerW);
        // DC link: deviates at most 1 % and is back within 0.2 % at the end
        assertTrue(dcMax < 1111 && dcMin > 1089, "DC " + dcMin + ".." + dcMax);
        assertEquals(1100, ClosedLoop.mean(r, 1, 55, 60.5), 2.2);
    }

    private static double[][] gust(double to) {
        final ClosedLoop cl = new ClosedLoop(TURBINE, ControllerFile.defaults(), 13.0);
        cl.run(0.5);
        cl.plant.setWindSpeed(to);
        return cl.record(30.0, 200, "p_grid_pu", "rotor_speed_rad_s", "pitch_deg", "trip_flags", "v_dc_v");
    }

    @Test
    void shouldHoldRatedPowerWithPitchAboveRatedWithoutOverspeed() {
        // a 3 m/s step (13 -> 16 m/s) and a harsh 5 m/s step (13 -> 18 m/s), pitch rate limited to 8 deg/s
        for (double to : new double[] {16.0, 18.0}) {
            final double[][] r = gust(to);
            final double wMax = ClosedLoop.max(r, 2, 0, 31);
            System.out.printf("wind 13 -> %.0f m/s: speed max %.4f rad/s (%.1f %% over rated %.2f, trip %.2f), pitch %.1f -> %.1f deg, P %.3f..%.3f pu over the last 10 s%n",
                    to, wMax, (wMax / TURBINE.ratedRotorSpeedRadPerS - 1) * 100, TURBINE.ratedRotorSpeedRadPerS,
                    TURBINE.overspeedTripRadPerS, r[3][0], ClosedLoop.mean(r, 3, 25, 31),
                    ClosedLoop.min(r, 1, 20, 31), ClosedLoop.max(r, 1, 20, 31));
            assertEquals(0.0, ClosedLoop.max(r, 4, 0, 31), "no trip");
            assertTrue(wMax < TURBINE.overspeedTripRadPerS, "below the overspeed trip");
            if (to <= 16.0) {
                assertTrue(wMax < 1.1 * TURBINE.ratedRotorSpeedRadPerS, "within 10 % of rated speed (common practice)");
            }
            // power held at rated over the last 10 s: generator-shaft power is held at rated, the grid
            // sees it less the copper and choke losses (about 1.5 %)
            assertEquals(0.985, ClosedLoop.mean(r, 1, 20, 31), 0.015);
            assertTrue(ClosedLoop.max(r, 1, 20, 31) < 1.01);
            assertEquals(TURBINE.ratedRotorSpeedRadPerS, ClosedLoop.mean(r, 2, 20, 31), 0.01 * TURBINE.ratedRotorSpeedRadPerS);
            assertTrue(ClosedLoop.mean(r, 3, 25, 31) > r[3][0] + 3.0, "pitched out");
        }
    }
}
