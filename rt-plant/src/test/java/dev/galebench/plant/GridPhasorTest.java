package dev.galebench.plant;

import static org.junit.jupiter.api.Assertions.assertEquals;

import dev.galebench.plant.support.SteadyDriver;
import org.apache.commons.math3.complex.Complex;
import org.junit.jupiter.api.Test;

/**
 * The dynamic grid side against phasor circuit analysis (steady-state AC circuit theory, any
 * textbook; complex arithmetic by Apache Commons Math): with the converter voltage held fixed,
 * a grid dip settles to I = (V_c - E) / Z_total, the terminal voltage is the voltage divider
 * V_t = E + Z_down I, and the power at the point of connection is S = 1.5 V_poc conj(I).
 * For an unbalanced dip the negative sequence of the source divides as |V_t-| = |E-| |Z_f| / |Z_total|
 * because the converter injects none.
 */
class GridPhasorTest {
    // a stiff DC link (100 F) so the held converter voltage stays where the phasor solution
    // assumes it; the DC link itself is checked elsewhere
    private final TurbineParameters p = TurbineFile.defaults().with("dc_link.capacitance_f", 100.0);
    private final GridNetwork net = new GridNetwork(p);
    private final double omega = 2.0 * Math.PI * p.gridFrequencyHz;
    private final double vBase = PerUnitBase.gridSide(p).voltagePeakV;

    private Complex z(double r, double l) {
        return new Complex(r, omega * l);
    }

    @Test
    void shouldSettleToTheVoltageDividerDuringABalancedDip() {
        OperatingPoint op = SteadyState.solve(p, 2.0, 1.0, 0.3); // idle, 0.3 pu capacitive
        TurbinePlant plant = new TurbinePlant(p, 10_000);
        plant.initialise(op);
        plant.setGridVoltagePu(0.7, 0.7, 0.7);
        new SteadyDriver(plant, op).run(50_000); // 0.5 s = 11 L/R time constants of the grid loop
        double[] s = new double[plant.signalCount()];
        plant.sample(s);

        Complex vc = new Complex(op.converterVoltageDV, op.converterVoltageQV);
        Complex e = new Complex(0.7 * vBase, 0.0);
        Complex zf = z(net.chokeResistanceOhm, net.chokeInductanceH);
        Complex zd = z(net.downstreamResistanceOhm(), net.downstreamInductanceH());
        Complex zg = z(net.gridResistanceOhm, net.gridInductanceH);
        Complex i = vc.subtract(e).divide(zf.add(zd));
        Complex vt = e.add(zd.multiply(i));
        Complex vpoc = e.add(zg.multiply(i));
        Complex spoc = vpoc.multiply(i.conjugate()).multiply(1.5);

        double iTol = 1e-3 * i.abs();
        assertEquals(i.getReal(), s[TurbinePlant.S_IG_D], iTol, "i_grid_d");
        assertEquals(i.getImaginary(), s[TurbinePlant.S_IG_Q], iTol, "i_grid_q");
        // terminal voltage sampled at step ends carries the held-converter-voltage lag of half
        // a step (omega h / 2 = 1.6 mrad at 10 us): 0.25 % of nominal covers it
        assertEquals(vt.getReal(), s[TurbinePlant.S_VT_D], 2.5e-3 * vBase, "v_term_d");
        assertEquals(vt.getImaginary(), s[TurbinePlant.S_VT_Q], 2.5e-3 * vBase, "v_term_q");
        assertEquals(vt.abs() / vBase, s[TurbinePlant.S_VT_PU], 2.5e-3, "v_term_pu");
        assertEquals(vpoc.abs() / vBase, s[TurbinePlant.S_V_POC_PU], 1e-3, "v_poc_pu");
        assertEquals(spoc.getReal(), s[TurbinePlant.S_P_POC], 2e-3 * p.ratedPowerW, "p_poc_w");
        assertEquals(spoc.getImaginary(), s[TurbinePlant.S_Q_POC], 2e-3 * p.ratedPowerW, "q_poc_var");
    }

    @Test
    void shouldDivideTheNegativeSequenceOfAnUnbalancedDip() {
        OperatingPoint op = SteadyState.solve(p, 2.0, 1.0, 0.0);
        TurbinePlant plant = new TurbinePlant(p, 20_000);
        plant.initialise(op);
        double ua = 0.5, ub = 0.9, uc = 1.0;
        plant.setGridVoltagePu(ua, ub, uc);
        new SteadyDriver(plant, op).run(25_000); // 0.5 s
        double[] s = new double[plant.signalCount()];
        plant.sample(s);
        Complex a = new Complex(Math.cos(2 * Math.PI / 3), Math.sin(2 * Math.PI / 3));
        Complex va = new Complex(ua, 0);
        Complex vb = new Complex(ub * Math.cos(-2 * Math.PI / 3), ub * Math.sin(-2 * Math.PI / 3));
        Complex vcc = new Complex(uc * Math.cos(2 * Math.PI / 3), uc * Math.sin(2 * Math.PI / 3));
        // symmetrical components (Fortescue): V- = (Va + a^2 Vb + a Vc) / 3
        double eNeg = va.add(a.multiply(a).multiply(vb)).add(a.multiply(vcc)).divide(3.0).abs();
        Complex zf = z(net.chokeResistanceOhm, net.chokeInductanceH);
        Complex zt = zf.add(z(net.downstreamResistanceOhm(), net.downstreamInductanceH()));
        assertEquals(eNeg * zf.abs() / zt.abs(), s[TurbinePlant.S_VT_NEG_PU], 2e-3, "v_term_neg_pu");
        assertEquals((ua + ub + uc) / 3.0, s[TurbinePlant.S_V_SOURCE_PU], 1e-12);
    }
}
