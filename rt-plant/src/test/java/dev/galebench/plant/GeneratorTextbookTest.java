package dev.galebench.plant;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.junit.jupiter.api.Test;

/**
 * The PMSG model against the textbook machine equations (Krause, Wasynczuk, Sudhoff, "Analysis
 * of Electric Machinery and Drive Systems", permanent-magnet AC machine, from memory): in
 * motor convention {@code T_e = (3/2)(P/2)(lambda'_m i_qs + (L_d - L_q) i_ds i_qs)} with P poles,
 * {@code v_qs = r_s i_qs + omega_r (L_d i_ds + lambda'_m)} and {@code v_ds = r_s i_ds - omega_r L_q i_qs}
 * in steady state. The plant uses generator convention (currents out), so motor-convention
 * currents are the negated plant currents, and the plant's braking torque is the negated
 * motor torque. A salient machine with a non-zero d current exercises the reluctance term.
 */
class GeneratorTextbookTest {

    @Test
    void shouldMatchTextbookTorqueVoltageAndPowerOfASalientMachine() {
        TurbineParameters p = TurbineFile.defaults()
                .with("generator.ld_h", 3.2e-4)
                .with("generator.lq_h", 4.8e-4);
        OperatingPoint op = SteadyState.solve(p, 9.0, 1.0, 0.0);
        // textbook steady state at the same speed with i_d = -1500 A (generator convention)
        double poles = 2.0 * p.polePairs;
        double we = op.generatorElectricalSpeedRadPerS;
        double idMotor = 1500.0;                 // = -i_d(generator)
        double iqMotor = -op.statorCurrentQA;
        double vqMotor = p.statorResistanceOhm * iqMotor + we * (p.dAxisInductanceH * idMotor + p.magnetFluxWb);
        double vdMotor = p.statorResistanceOhm * idMotor - we * p.qAxisInductanceH * iqMotor;
        double teMotor = 1.5 * (poles / 2.0) * (p.magnetFluxWb * iqMotor + (p.dAxisInductanceH - p.qAxisInductanceH) * idMotor * iqMotor);

        op.statorCurrentDA = -idMotor;
        op.statorCurrentQA = -iqMotor;
        op.statorVoltageDV = vdMotor;            // terminal voltage is the same in both conventions
        op.statorVoltageQV = vqMotor;
        TurbinePlant plant = new TurbinePlant(p, 10_000);
        plant.initialise(op);
        double[] s = new double[plant.signalCount()];
        plant.sample(s);
        assertEquals(-teMotor, s[TurbinePlant.S_T_GEN], 1e-9 * Math.abs(teMotor), "braking torque");
        // power: electrical output = mechanical input - copper loss; the plant's terminal voltage
        // is the held converter voltage, rotated by half a step (omega_e h / 2 = 0.4 mrad at 10 us)
        // against the textbook's, which bounds the difference at 1e-3 of rated
        double wm = we / p.polePairs;
        double copper = 1.5 * p.statorResistanceOhm * (idMotor * idMotor + iqMotor * iqMotor);
        assertEquals(-teMotor * wm - copper, s[TurbinePlant.S_P_STATOR], 1e-3 * p.ratedPowerW, "stator power");
        // the textbook steady state is a steady state of the plant's voltage equations
        double[] dx = new double[TurbinePlant.STATE_COUNT];
        plant.derivatives(plant.x, dx);
        double idScale = 1500.0 * p.statorResistanceOhm / p.dAxisInductanceH; // A/s, a clear non-zero rate
        // the converter voltage is realised through duties held for half a step ago: allow its rotation
        assertEquals(0.0, dx[TurbinePlant.I_D], 0.02 * idScale + we * 0.5 * 10e-6 * Math.hypot(vdMotor, vqMotor) / p.dAxisInductanceH);
        assertEquals(0.0, dx[TurbinePlant.I_Q], 0.02 * idScale + we * 0.5 * 10e-6 * Math.hypot(vdMotor, vqMotor) / p.qAxisInductanceH);
    }

    @Test
    void shouldMatchTheRotorFrameVoltagesOfTheOperatingPoint() {
        TurbineParameters p = TurbineFile.defaults();
        OperatingPoint op = SteadyState.solve(p, 9.0, 1.0, 0.0);
        TurbinePlant plant = new TurbinePlant(p, 10_000);
        plant.initialise(op);
        SensorView v = new SensorView();
        plant.sense(v);
        // bring-up dq of the measured phases equals the operating point (filters settled)
        assertEquals(op.statorCurrentQA, v.statorCurrentQA, 1e-6 * Math.abs(op.statorCurrentQA));
        assertEquals(op.statorCurrentDA, v.statorCurrentDA, 1e-6 * Math.abs(op.statorCurrentQA));
        assertEquals(op.gridCurrentDA, v.gridCurrentDA, 1e-6 * Math.abs(op.gridCurrentDA));
        assertEquals(op.dcLinkVoltageV, v.dcLinkVoltageV, 0.0);
        assertEquals(op.rotorSpeedRadPerS * p.gearRatio, v.rotorSpeedRadPerS, 0.0);
    }
}
