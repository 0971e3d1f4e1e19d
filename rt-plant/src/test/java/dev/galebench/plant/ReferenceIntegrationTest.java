package dev.galebench.plant;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.math3.ode.FirstOrderDifferentialEquations;
import org.apache.commons.math3.ode.nonstiff.DormandPrince853Integrator;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/**
 * The fixed-step RK4 trajectory against a high-order adaptive reference: Apache Commons Math
 * {@code DormandPrince853Integrator} (8th-order embedded Runge-Kutta, tolerances 1e-12
 * relative) integrating the same right-hand side over every step with the same held inputs.
 * Only the integration differs.
 *
 * <p>Open loop, 0.6 s: the 9 m/s operating point, converter duties computed from time alone
 * (fixed converter voltages rotating at the initial generator frequency and at the grid
 * frequency, with the nominal DC voltage, so no feedback from the plant's state), and a
 * balanced grid dip to 0.9 pu from 0.10 s to 0.20 s followed by a 5-degree phase jump at
 * 0.35 s. Without control the DC link swings widely (an open-loop converter pair is barely
 * damped; the hardware trips are raised for this test), which makes a demanding trajectory. The errors are taken relative to the
 * range of each state over the run.
 */
class ReferenceIntegrationTest {
    static final int[] COMPARED = {TurbinePlant.W_ROTOR, TurbinePlant.W_GEN, TurbinePlant.TWIST, TurbinePlant.PITCH,
        TurbinePlant.I_D, TurbinePlant.I_Q, TurbinePlant.V_DC, TurbinePlant.I_ALPHA, TurbinePlant.I_BETA};
    static final String[] NAMES = {"w_rotor", "w_gen", "twist", "pitch", "i_d", "i_q", "v_dc", "i_alpha", "i_beta"};

    @ParameterizedTest(name = "step {0} ns")
    @ValueSource(longs = {50_000, 10_000})
    void shouldMatchTheDormandPrince853ReferenceThroughAGridDip(long stepNs) {
        // hardware trips moved out of the way: an open-loop converter pair is barely damped and
        // its DC link swings far; the comparison needs a smooth trajectory, not a trip
        TurbineParameters p = TurbineFile.defaults()
                .with("dc_link.overvoltage_trip_v", 5000.0)
                .with("converter.msc_current_trip_a", 1e6)
                .with("converter.gsc_current_trip_a", 1e6);
        OperatingPoint op = SteadyState.solve(p, 9.0, 1.0, 0.0);
        TurbinePlant plant = new TurbinePlant(p, stepNs);
        plant.initialise(op);
        final double h = stepNs * 1e-9;
        final int steps = (int) Math.round(0.6 / h);
        final double[] y = plant.x.clone();
        final DormandPrince853Integrator dp = new DormandPrince853Integrator(1e-14, h, 1e-12, 1e-12);
        final FirstOrderDifferentialEquations ode = new FirstOrderDifferentialEquations() {
            @Override
            public int getDimension() {
                return TurbinePlant.STATE_COUNT;
            }

            @Override
            public void computeDerivatives(double t, double[] state, double[] dot) {
                plant.derivatives(state, dot);
            }
        };
        double[] lo = new double[COMPARED.length];
        double[] hi = new double[COMPARED.length];
        double[] maxErr = new double[COMPARED.length];
        java.util.Arrays.fill(lo, Double.POSITIVE_INFINITY);
        java.util.Arrays.fill(hi, Double.NEGATIVE_INFINITY);
        double maxAngleErr = 0.0;
        final BoardCommand cmd = new BoardCommand();
        final double we0 = op.generatorElectricalSpeedRadPerS;
        final double wg0 = 2.0 * Math.PI * p.gridFrequencyHz;
        double vdcMax = 0.0;
        double vdcMin = Double.POSITIVE_INFINITY;
        double idMax = 0.0;
        for (int k = 0; k < steps; k++) {
            final double tMid = (k + 0.5) * h;
            final double t = k * h;
            boolean dip = t >= 0.10 && t < 0.20;
            plant.setGridVoltagePu(dip ? 0.9 : 1.0, dip ? 0.9 : 1.0, dip ? 0.9 : 1.0);
            plant.setGridPhaseOffsetRad(t >= 0.35 ? Math.toRadians(5.0) : 0.0);
            op.fillCommand(cmd, we0 * tMid, wg0 * tMid, p.dcVoltageNominalV);
                        plant.step(cmd);
            double[] out = new double[TurbinePlant.STATE_COUNT];
            dp.integrate(ode, t, y, t + h, out);
            System.arraycopy(out, 0, y, 0, y.length);
            for (int i = 0; i < COMPARED.length; i++) {
                int s = COMPARED[i];
                lo[i] = Math.min(lo[i], y[s]);
                hi[i] = Math.max(hi[i], y[s]);
                maxErr[i] = Math.max(maxErr[i], Math.abs(plant.x[s] - y[s]));
            }
            double da = Math.IEEEremainder(plant.x[TurbinePlant.GEN_ANGLE] - y[TurbinePlant.GEN_ANGLE], 2.0 * Math.PI);
            maxAngleErr = Math.max(maxAngleErr, Math.abs(da));
            vdcMax = Math.max(vdcMax, y[TurbinePlant.V_DC]);
            vdcMin = Math.min(vdcMin, y[TurbinePlant.V_DC]);
            idMax = Math.max(idMax, Math.abs(y[TurbinePlant.I_ALPHA]));
        }
        assertEquals(0, plant.tripFlags(), "the open-loop transient must not trip");
        double worst = 0.0;
        StringBuilder report = new StringBuilder("step " + stepNs + " ns, relative to range:");
        for (int i = 0; i < COMPARED.length; i++) {
            double range = Math.max(hi[i] - lo[i], 1e-9 * Math.max(Math.abs(hi[i]), 1.0));
            double rel = maxErr[i] / Math.max(range, Math.abs(hi[i]) * 1e-6 + 1e-300);
            report.append(String.format(java.util.Locale.ROOT, " %s %.2e (range %.4g);", NAMES[i], rel, hi[i] - lo[i]));
            if (COMPARED[i] != TurbinePlant.PITCH) {
                worst = Math.max(worst, rel);
            }
        }
        report.append(String.format(java.util.Locale.ROOT, " angle %.2e rad; vdc %.1f .. %.1f V", maxAngleErr, vdcMin, vdcMax));
        System.out.println(report);
        assertTrue(vdcMin > 100.0, "the DC link must not collapse (the plant clamps it at 0): " + report);
        assertTrue(worst < 1e-6, report.toString());
        assertTrue(maxAngleErr < 1e-6, report.toString());
    }
}
