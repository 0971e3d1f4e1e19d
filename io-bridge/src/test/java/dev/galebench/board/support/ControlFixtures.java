package dev.galebench.board.support;

import dev.galebench.plant.TurbineParameters;
import java.util.HashMap;
import java.util.Map;

/**
 * Shared fixtures for the controller tests: a turbine of our own design (4 MW direct drive,
 * 690 V), written out here so the controller's unit tests do not depend on the plant's loader.
 */
public final class ControlFixtures {
    private ControlFixtures() {
    }

    /** The flat key map of the fixture turbine (mutable copy: tests change single keys). */
    public static Map<String, Double> turbineKeys() {
        final Map<String, Double> m = new HashMap<>();
        m.put("rotor.air_density_kg_m3", 1.225);
        m.put("rotor.radius_m", 55.0);
        // Heier variant (REFERENCES.md 1a)
        m.put("rotor.cp_c1", 0.5176);
        m.put("rotor.cp_c2", 116.0);
        m.put("rotor.cp_c3", 0.4);
        m.put("rotor.cp_c4", 0.0);
        m.put("rotor.cp_c5", 5.0);
        m.put("rotor.cp_c6", 21.0);
        m.put("rotor.cp_c7", 0.0068);
        m.put("rotor.cp_c8", 0.08);
        m.put("rotor.cp_c9", 0.035);
        m.put("rotor.cp_x", 1.0);
        m.put("rotor.cut_in_wind_m_s", 3.0);
        m.put("rotor.rated_wind_m_s", 11.0);
        m.put("rotor.cut_out_wind_m_s", 25.0);
        m.put("rotor.rated_speed_rad_s", 1.62);
        m.put("rotor.min_speed_rad_s", 0.5);
        m.put("rotor.overspeed_trip_rad_s", 1.95);
        m.put("pitch.min_rad", 0.0);
        m.put("pitch.max_rad", 1.5);
        m.put("pitch.rate_max_rad_s", 0.14);
        m.put("pitch.servo_time_constant_s", 0.1);
        m.put("drivetrain.rotor_inertia_kg_m2", 14.0e6);
        m.put("drivetrain.generator_inertia_kg_m2", 1.0e6);
        m.put("drivetrain.two_mass", 0.0);
        m.put("drivetrain.shaft_stiffness_nm_rad", 5.0e8);
        m.put("drivetrain.shaft_damping_nms_rad", 5.0e6);
        m.put("drivetrain.friction_nms_rad", 0.0);
        m.put("drivetrain.gear_ratio", 1.0);
        m.put("generator.rated_power_w", 4.0e6);
        m.put("generator.pole_pairs", 60.0);
        m.put("generator.stator_resistance_ohm", 0.0012);
        m.put("generator.ld_h", 0.00035);
        m.put("generator.lq_h", 0.00035);
        m.put("generator.magnet_flux_wb", 5.6);
        m.put("generator.rated_voltage_v", 690.0);
        m.put("dc_link.capacitance_f", 0.033);
        m.put("dc_link.nominal_voltage_v", 1100.0);
        m.put("dc_link.chopper_resistance_ohm", 0.3);
        m.put("dc_link.overvoltage_trip_v", 1350.0);
        m.put("converter.msc_current_trip_a", 8000.0);
        m.put("converter.gsc_current_trip_a", 7100.0);
        m.put("converter.rated_current_a", 3350.0);
        m.put("converter.switching_frequency_hz", 2500.0);
        m.put("grid_filter.inductance_h", 57e-6);
        m.put("grid_filter.resistance_ohm", 0.00036);
        m.put("converter_transformer.lv_voltage_v", 690.0);
        m.put("converter_transformer.mv_voltage_v", 33000.0);
        m.put("converter_transformer.rating_va", 4.4e6);
        m.put("converter_transformer.short_circuit_pu", 0.08);
        m.put("converter_transformer.x_over_r", 8.0);
        m.put("plant_transformer.hv_voltage_v", 132000.0);
        m.put("plant_transformer.rating_va", 5.0e6);
        m.put("plant_transformer.short_circuit_pu", 0.08);
        m.put("plant_transformer.x_over_r", 10.0);
        m.put("grid.frequency_hz", 50.0);
        m.put("grid.short_circuit_ratio", 10.0);
        m.put("grid.x_over_r", 7.0);
        m.put("measurement.current_filter_s", 20e-6);
        m.put("measurement.voltage_filter_s", 20e-6);
        return m;
    }

    public static TurbineParameters turbine() {
        return new TurbineParameters(turbineKeys());
    }
}
