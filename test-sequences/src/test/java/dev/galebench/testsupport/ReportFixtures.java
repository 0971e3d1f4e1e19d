package dev.galebench.testsupport;

import dev.galebench.plant.TurbineParameters;
import dev.galebench.rt.Sample;
import dev.galebench.rt.SampleConsumer;

import java.util.HashMap;
import java.util.Map;

/** Shared fixtures of the report tests: a small turbine of our own and a sample-stream driver. */
public final class ReportFixtures {
    private ReportFixtures() {
    }

    /**
     * Ratings of a made-up 3 MW, 690 V full-converter turbine (our own demo numbers, not a
     * reference turbine). Only the ratings matter to the report tests.
     */
    public static TurbineParameters smallTurbine() {
        Map<String, Double> v = new HashMap<>();
        v.put("rotor.air_density_kg_m3", 1.225);
        v.put("rotor.radius_m", 55.0);
        for (int i = 1; i <= 9; i++) {
            v.put("rotor.cp_c" + i, 0.1 * i);
        }
        v.put("rotor.cp_x", 1.5);
        v.put("rotor.cut_in_wind_m_s", 3.5);
        v.put("rotor.rated_wind_m_s", 11.5);
        v.put("rotor.cut_out_wind_m_s", 24.0);
        v.put("rotor.rated_speed_rad_s", 1.6);
        v.put("rotor.min_speed_rad_s", 0.7);
        v.put("rotor.overspeed_trip_rad_s", 2.0);
        v.put("pitch.min_rad", 0.0);
        v.put("pitch.max_rad", 1.57);
        v.put("pitch.rate_max_rad_s", 0.14);
        v.put("pitch.servo_time_constant_s", 0.1);
        v.put("drivetrain.rotor_inertia_kg_m2", 1.2e7);
        v.put("drivetrain.generator_inertia_kg_m2", 400.0);
        v.put("drivetrain.two_mass", 0.0);
        v.put("drivetrain.shaft_stiffness_nm_rad", 3.0e8);
        v.put("drivetrain.shaft_damping_nms_rad", 2.0e6);
        v.put("drivetrain.friction_nms_rad", 0.0);
        v.put("drivetrain.gear_ratio", 100.0);
        v.put("generator.rated_power_w", 3.0e6);
        v.put("generator.pole_pairs", 3.0);
        v.put("generator.stator_resistance_ohm", 0.002);
        v.put("generator.ld_h", 0.0005);
        v.put("generator.lq_h", 0.0005);
        v.put("generator.magnet_flux_wb", 1.9);
        v.put("generator.rated_voltage_v", 690.0);
        v.put("dc_link.capacitance_f", 0.02);
        v.put("dc_link.nominal_voltage_v", 1100.0);
        v.put("dc_link.chopper_resistance_ohm", 0.5);
        v.put("dc_link.overvoltage_trip_v", 1300.0);
        v.put("converter.msc_current_trip_a", 5000.0);
        v.put("converter.gsc_current_trip_a", 5200.0);
        v.put("converter.rated_current_a", 2700.0);
        v.put("converter.switching_frequency_hz", 3000.0);
        v.put("grid_filter.inductance_h", 0.00008);
        v.put("grid_filter.resistance_ohm", 0.001);
        v.put("converter_transformer.lv_voltage_v", 690.0);
        v.put("converter_transformer.mv_voltage_v", 33000.0);
        v.put("converter_transformer.rating_va", 3.3e6);
        v.put("converter_transformer.short_circuit_pu", 0.07);
        v.put("converter_transformer.x_over_r", 8.0);
        v.put("plant_transformer.hv_voltage_v", 132000.0);
        v.put("plant_transformer.rating_va", 5.0e6);
        v.put("plant_transformer.short_circuit_pu", 0.1);
        v.put("plant_transformer.x_over_r", 10.0);
        v.put("grid.frequency_hz", 50.0);
        v.put("grid.short_circuit_ratio", 10.0);
        v.put("grid.x_over_r", 7.0);
        v.put("measurement.current_filter_s", 0.0001);
        v.put("measurement.voltage_filter_s", 0.0001);
        return new TurbineParameters(v);
    }

    /** Computes the value of every signal at one exchange. */
    @FunctionalInterface
    public interface SignalFunction {
        void fill(long exchangeIndex, double timeS, double[] out);
    }

    /**
     * Feeds {@code count} samples to {@code consumer} the way the ring does (one reused
     * {@link Sample}), exchange k at plant time (k + 1) * period. Does not call onEnd.
     */
    public static void feed(SampleConsumer consumer, String[] names, long periodNs, long count, SignalFunction f) {
        Sample s = new Sample(names.length);
        for (long k = 0; k < count; k++) {
            s.exchangeIndex = k;
            s.stepIndex = k + 1;
            s.plantTimeNs = (k + 1) * periodNs;
            f.fill(k, s.plantTimeNs * 1e-9, s.values);
            consumer.onSample(s);
        }
    }
}
