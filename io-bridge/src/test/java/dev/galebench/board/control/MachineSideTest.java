package dev.galebench.board.control;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.galebench.board.support.ControlFixtures;
import dev.galebench.plant.BoardCommand;
import dev.galebench.plant.SensorView;
import dev.galebench.plant.TurbineParameters;
import java.util.Map;
import org.junit.jupiter.api.Test;

/** Machine-side references: MPPT torque law and MTPA for a salient machine. */
class MachineSideTest {
    private static ReferenceController controller(TurbineParameters p) {
        final ReferenceController c = new ReferenceController(p, ControllerFile.defaults());
        c.setSamplePeriod(50e-6);
        final SensorView in = new SensorView();
        ReferenceControllerAllocationTest.fill(in, 0);
        c.start(in);
        for (int k = 0; k < 20_000; k++) { // 1 s: the 50 ms speed filter has settled at 1.5 rad/s
            ReferenceControllerAllocationTest.fill(in, k);
            c.update(in, new BoardCommand());
        }
        return c;
    }

    @Test
    void shouldFollowTheOptimalTorqueCurveBelowTheTransitionSpeed() {
        // fixture rated speed 1.62 rad/s, transition at 0.95 pu = 1.539 rad/s; the measured speed is 1.5 rad/s
        final TurbineParameters p = ControlFixtures.turbine();
        final ReferenceController c = controller(p);
        final ControllerTuning t = c.tuning();
        // k_opt = 1/2 rho pi R^5 Cp_max / lambda_opt^3 (REFERENCES.md 2), T = k_opt w^2
        assertEquals(t.kOptGeneratorNmPerRad2S2 * 1.5 * 1.5, c.torqueReferenceNm(), 1e-6 * c.torqueReferenceNm());
        assertEquals(0.0, c.statorDCurrentRefA(), 0.0, "non-salient: i_d = 0");
        assertEquals(c.torqueReferenceNm() / (1.5 * p.polePairs * p.magnetFluxWb), c.statorQCurrentRefA(), 1e-9);
        // torque law: constant power above rated speed, continuous at the corners
        assertEquals(p.ratedPowerW / (1.1 * t.ratedGeneratorSpeedRadPerS),
                c.torqueReference(1.1 * t.ratedGeneratorSpeedRadPerS), 1e-6);
        final double ws = 0.95 * t.ratedGeneratorSpeedRadPerS;
        assertEquals(c.torqueReference(ws - 1e-9), c.torqueReference(ws + 1e-9), 1e-6 * c.torqueReference(ws));
        assertEquals(c.torqueReference(t.ratedGeneratorSpeedRadPerS - 1e-9),
                c.torqueReference(t.ratedGeneratorSpeedRadPerS + 1e-9), 1e-6 * t.ratedTorqueNm);
    }

    @Test
    void shouldUseMaximumTorquePerAmpereOnASalientMachine() {
        final Map<String, Double> keys = ControlFixtures.turbineKeys();
        keys.put("generator.ld_h", 0.00030);
        keys.put("generator.lq_h", 0.00045);
        final TurbineParameters p = new TurbineParameters(keys);
        final ReferenceController c = controller(p);
        final double id = c.statorDCurrentRefA();
        final double iq = c.statorQCurrentRefA();
        final double psi = p.magnetFluxWb;
        final double dl = p.dAxisInductanceH - p.qAxisInductanceH;
        final double torque = 1.5 * p.polePairs * (psi * iq + dl * id * iq);
        // textbook PMSM torque (REFERENCES.md 5, from memory) reproduces the reference
        assertEquals(c.torqueReferenceNm(), torque, 1e-6 * torque);
        assertTrue(id < 0.0, "reluctance torque needs negative d current: " + id);
        // MTPA: any other split of the same torque needs more current
        final double mag = Math.hypot(id, iq);
        for (double delta : new double[] {-200, -50, 50, 200}) {
            final double id2 = id + delta;
            final double iq2 = torque / (1.5 * p.polePairs * (psi + dl * id2));
            assertTrue(Math.hypot(id2, iq2) > mag, "split with d " + id2 + " needs less current");
        }
    }
}
