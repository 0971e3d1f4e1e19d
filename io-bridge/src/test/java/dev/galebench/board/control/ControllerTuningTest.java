package dev.galebench.board.control;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.galebench.board.support.ControlFixtures;
import dev.galebench.plant.TurbineParameters;
import java.util.Map;
import org.junit.jupiter.api.Test;

class ControllerTuningTest {
    @Test
    void shouldReproduceTheImcWorkedExample() {
        // REFERENCES.md 3a worked example [D] on Harnefors & Nee 1998 (IMC: Kp = alpha L, Ki = alpha R):
        // L = 113.7 uH, R = 1.19 mOhm, alpha = 2 pi 300 -> Kp 0.2142 Ohm, Ki 2.244 Ohm/s, t_r 1.166 ms
        final double alpha = 2 * Math.PI * 300;
        assertEquals(0.2142, ControllerTuning.imcKp(alpha, 113.7e-6), 5e-4);
        assertEquals(2.244, ControllerTuning.imcKi(alpha, 1.19e-3), 5e-3);
        assertEquals(1.166e-3, ControllerTuning.LN9 / alpha, 1e-6);
    }

    @Test
    void shouldReproduceThePllExamples() {
        // REFERENCES.md 4, example 2 [D]: zeta 0.707, wn 65.05 rad/s -> Kp 92.0, Ki 4232
        assertEquals(92.0, SrfPll.kpFor(65.05, 0.707), 0.05);
        assertEquals(4232.0, SrfPll.kiFor(65.05), 0.5);
        // example 1 [C: DSP-SE]: zeta 0.7, t_s 20 ms -> Kp = 9.2/t_s = 460 with wn = 4.6/(zeta t_s)
        assertEquals(460.0, SrfPll.kpFor(4.6 / (0.7 * 0.020), 0.7), 1e-9);
    }

    @Test
    void shouldReproduceTheNrel5MwPitchGainAndTorqueGain() {
        // Jonkman et al. 2009 (NREL/TP-500-38060): PC_KP = 0.01882681 s at pitch 0 [C: DISCON consts],
        // from J = 43,784,725 kg m2, W0 = 1.2671 rad/s, N = 97, zeta 0.7, wn 0.6 rad/s and
        // dP/dtheta(0) = -25.52e6 W/rad (sensitivity from memory). Ki/Kp = wn/(2 zeta).
        final double kp = ControllerTuning.pitchKp(43_784_725, 1.2671, 97, -25.52e6, 0.7, 0.6);
        final double ki = ControllerTuning.pitchKi(43_784_725, 1.2671, 97, -25.52e6, 0.6);
        assertEquals(0.01882681, kp, 0.01882681 * 0.005);
        assertEquals(0.008068634, ki, 0.008068634 * 0.005);
        // REFERENCES.md 2: NREL 5-MW k_opt = 2.1286e6 N m/(rad/s)^2 (R 62.94, Cp 0.482, lambda 7.55), matches DISCON
        assertEquals(2.1286e6, ControllerTuning.optimalTorqueGain(1.225, 62.94, 0.482, 7.55), 2e3);
    }

    @Test
    void shouldFindTheHeierVariantOptimum() {
        // REFERENCES.md 1a [D]: Heier variant (c7 = 0.0068): lambda_opt 8.100, Cp_max 0.4800
        final ControllerTuning t = ControllerTuning.derive(ControlFixtures.turbine(), ControllerFile.defaults());
        assertEquals(8.100, t.lambdaOpt, 0.01);
        assertEquals(0.4800, t.cpMax, 5e-4);
    }

    @Test
    void shouldTuneGridLoopsFromTheTotalImpedance() {
        final TurbineParameters p = ControlFixtures.turbine();
        final ControllerTuning t = ControllerTuning.derive(p, ControllerFile.defaults());
        final double w = 2 * Math.PI * 50;
        final double lv2 = 690.0 * 690.0;
        // per-unit impedances referred to the LV side: converter transformer, plant transformer, grid (SCR 10)
        final double xCt = 0.08 * lv2 / 4.4e6 * 8 / Math.sqrt(65);
        final double xPt = 0.08 * lv2 / 5.0e6 * 10 / Math.sqrt(101);
        final double xG = lv2 / (10 * 4.0e6) * 7 / Math.sqrt(50);
        final double lTotal = 57e-6 + (xCt + xPt + xG) / w;
        assertEquals(lTotal, t.totalInductanceH, 1e-12);
        assertEquals(ControllerTuning.LN9 / 0.010 * lTotal, t.gscKp, 1e-12);
        assertEquals(ControllerTuning.LN9 / 0.010 * t.totalResistanceOhm, t.gscKi, 1e-12);
        assertEquals(ControllerTuning.LN9 / 0.020 * 0.00035, t.mscKpQ, 1e-12);
        assertEquals(ControllerTuning.LN9 / 0.020 * 0.0012, t.mscKi, 1e-12);
        // DC loop: the closed-loop polynomial of C Vdc0 dv/dt = 1.5 Vg (Kp e + Ki int e) is s^2 + 2 zeta wn s + wn^2
        final double vg = Math.sqrt(2.0 / 3.0) * 690;
        final double a1 = 1.5 * vg * t.dcKp / (0.033 * 1100);
        final double a0 = 1.5 * vg * t.dcKi / (0.033 * 1100);
        assertEquals(2 * 0.8 * 2 * Math.PI * 5, a1, 1e-9);
        assertEquals(Math.pow(2 * Math.PI * 5, 2), a0, 1e-9);
        // pitch schedule: sensitivity negative, doubles at a positive pitch
        assertTrue(t.pitchSensitivityAtZeroWPerRad < 0);
        assertTrue(t.pitchScheduleThetaKRad > 0 && t.pitchScheduleThetaKRad < Math.toRadians(60));
    }

    @Test
    @SuppressWarnings("unchecked")
    void shouldExposeTheContractKeysInTheMap() {
        final Map<String, Object> m = ControllerTuning.derive(ControlFixtures.turbine(), ControllerFile.defaults()).toMap();
        for (String conv : new String[] {"msc", "gsc"}) {
            final Map<String, Object> cur = (Map<String, Object>) ((Map<String, Object>) m.get(conv)).get("current");
            for (String k : new String[] {"kp", "ki", "rise_time_s", "r_ohm", "l_h"}) {
                assertTrue(cur.get(k) instanceof Double, conv + ".current." + k);
            }
        }
        final Map<String, Object> dc = (Map<String, Object>) ((Map<String, Object>) m.get("gsc")).get("dc_voltage");
        assertTrue(dc.get("kp") instanceof Double && dc.get("ki") instanceof Double);
        final Map<String, Object> pll = (Map<String, Object>) m.get("pll");
        assertTrue(pll.get("kp") instanceof Double && pll.get("ki") instanceof Double);
    }
}
