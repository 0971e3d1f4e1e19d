package dev.galebench.plant;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.galebench.plant.support.SteadyDriver;
import java.util.Map;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/**
 * An initialised plant, driven open loop with the operating point's converter voltages
 * (fixed in their rotating frames, duties recomputed from the true angles each step), stays
 * where {@link SteadyState} put it for one second. Nothing regulates: a wrong steady state or a
 * wrong sign anywhere shows up as drift.
 */
class TurbinePlantSettledTest {

    @ParameterizedTest(name = "wind {0} m/s, grid {1} pu, q {2} pu, step {3} ns")
    @CsvSource({
        "2.0, 1.0, 0.0, 50000",
        "4.0, 1.0, 0.0, 50000",
        "7.0, 1.0, 0.0, 50000",
        "10.0, 1.0, 0.2, 50000",
        "10.85, 1.0, 0.0, 20000",
        "12.0, 1.0, -0.2, 50000",
        "18.0, 0.95, 0.3, 10000",
        "24.0, 1.05, 0.0, 50000"})
    void shouldStaySettledForOneSecondWhenInitialisedWithSteadyDuties(double wind, double gridPu, double qPu, long stepNs) {
        TurbineParameters p = TurbineFile.defaults();
        OperatingPoint op = SteadyState.solve(p, wind, gridPu, qPu);
        TurbinePlant plant = new TurbinePlant(p, stepNs);
        plant.initialise(op);
        double[] before = new double[plant.signalCount()];
        double[] after = new double[plant.signalCount()];
        plant.sample(before);
        new SteadyDriver(plant, op).run(1_000_000_000L / stepNs);
        plant.sample(after);
        assertEquals(0, plant.tripFlags(), "no trip");
        double rated = p.ratedPowerW;
        Map<String, Double> tol = Map.ofEntries(
                Map.entry("rotor_speed_rad_s", 1e-5 * p.ratedRotorSpeedRadPerS),
                Map.entry("generator_speed_rad_s", 1e-5 * p.ratedRotorSpeedRadPerS),
                Map.entry("pitch_deg", 1e-4),
                Map.entry("p_aero_w", 1e-4 * rated),
                Map.entry("t_shaft_nm", 1e-4 * rated / p.ratedRotorSpeedRadPerS),
                Map.entry("v_dc_v", 2e-3 * p.dcVoltageNominalV),
                Map.entry("i_stator_d_a", 2.0),
                Map.entry("i_stator_q_a", 2.0),
                Map.entry("i_grid_d_a", 2.0),
                Map.entry("i_grid_q_a", 2.0),
                Map.entry("p_grid_w", 1e-3 * rated),
                Map.entry("q_grid_var", 1e-3 * rated),
                Map.entry("p_poc_w", 1e-3 * rated),
                Map.entry("v_term_pu", 1e-3),
                Map.entry("v_term_neg_pu", 1e-3),
                Map.entry("v_poc_pu", 1e-3));
        for (int i = 0; i < plant.signalCount(); i++) {
            Double t = tol.get(plant.signalName(i));
            if (t != null) {
                assertEquals(before[i], after[i], t, plant.signalName(i) + " drifted");
            }
        }
        // and the initial sample is the operating point itself; terminal quantities are sampled
        // at step ends, where the held converter voltage lags by half a step of rotation
        // (omega h / 2 = 7.9 mrad at 50 us), which biases Q by up to about 0.5 % of rated
        assertEquals(op.gridPowerW, before[index(plant, "p_grid_w")], 2e-3 * rated, "p_grid_w at start");
        assertEquals(op.gridReactivePowerVar, before[index(plant, "q_grid_var")], 6e-3 * rated, "q_grid_var at start");
        assertEquals(op.rotorSpeedRadPerS, before[index(plant, "rotor_speed_rad_s")], 0.0, "rotor speed at start");
        assertTrue(after[index(plant, "v_term_neg_pu")] < 1e-3, "balanced source gives no negative sequence");
    }

    @ParameterizedTest(name = "{0}")
    @CsvSource({"one-mass, drivetrain.two_mass, 0", "salient, generator.lq_h, 6.0e-4", "weak grid, grid.short_circuit_ratio, 3.0",
        "no filters, measurement.current_filter_s, 0"})
    void shouldStaySettledForVariantsOfTheTurbine(String name, String key, double value) {
        TurbineParameters p = TurbineFile.defaults().with(key, value);
        TurbineFile.validate(p, name);
        OperatingPoint op = SteadyState.solve(p, 9.5, 1.0, 0.1);
        TurbinePlant plant = new TurbinePlant(p, 50_000);
        plant.initialise(op);
        double[] before = new double[plant.signalCount()];
        double[] after = new double[plant.signalCount()];
        plant.sample(before);
        new SteadyDriver(plant, op).run(20_000);
        plant.sample(after);
        assertEquals(0, plant.tripFlags());
        for (String s : new String[] {"rotor_speed_rad_s", "generator_speed_rad_s", "t_shaft_nm", "t_gen_nm", "p_aero_w"}) {
            int i = index(plant, s);
            assertEquals(before[i], after[i], 1e-5 * Math.abs(before[i]), s);
        }
        for (String s : new String[] {"p_grid_w", "q_grid_var", "p_stator_w"}) {
            int i = index(plant, s);
            assertEquals(before[i], after[i], 1e-3 * p.ratedPowerW, s);
        }
        SensorView v = new SensorView();
        plant.sense(v);
        assertEquals(op.statorCurrentQA, v.statorCurrentQA, 2e-3 * Math.abs(op.statorCurrentQA), "measured i_q");
    }

    @org.junit.jupiter.api.Test
    void shouldStaySettledWithAGearboxAndAFastGenerator() {
        // geared variant: N = 97, 3 pole pairs (f_e = 69 Hz at rated), flux and inductance scaled
        // to the same EMF and per-unit reactance as the direct drive
        double we = 3 * 97 * 1.5;
        TurbineParameters p = TurbineFile.defaults()
                .with("drivetrain.gear_ratio", 97.0)
                .with("generator.pole_pairs", 3.0)
                .with("generator.magnet_flux_wb", 518.5 / we)
                .with("generator.ld_h", 0.036 / we)
                .with("generator.lq_h", 0.036 / we)
                .with("drivetrain.generator_inertia_kg_m2", 8.0e5 / (97.0 * 97.0));
        TurbineFile.validate(p, "geared");
        OperatingPoint op = SteadyState.solve(p, 9.0, 1.0, 0.0);
        assertEquals(97.0 * op.rotorSpeedRadPerS, op.generatorSpeedRadPerS, 1e-12);
        TurbinePlant plant = new TurbinePlant(p, 20_000);
        plant.initialise(op);
        double[] before = new double[plant.signalCount()];
        double[] after = new double[plant.signalCount()];
        plant.sample(before);
        new SteadyDriver(plant, op).run(50_000);
        plant.sample(after);
        assertEquals(0, plant.tripFlags());
        for (String s : new String[] {"rotor_speed_rad_s", "generator_speed_rad_s", "t_shaft_nm", "t_gen_nm"}) {
            int i = index(plant, s);
            assertEquals(before[i], after[i], 1e-5 * Math.abs(before[i]), s);
        }
        assertEquals(op.gridPowerW, after[index(plant, "p_grid_w")], 2e-3 * p.ratedPowerW);
        assertEquals(op.generatorTorqueNm, after[index(plant, "t_gen_nm")], 1e-4 * op.generatorTorqueNm);
    }

    static int index(PlantModel plant, String name) {
        for (int i = 0; i < plant.signalCount(); i++) {
            if (plant.signalName(i).equals(name)) {
                return i;
            }
        }
        throw new AssertionError("no signal " + name);
    }
}
