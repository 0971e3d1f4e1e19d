package dev.galebench.plant;

import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.Map;

/**
 * Every physical parameter of the simulated turbine and its grid connection, SI units.
 * Built once (from a turbine file, by {@code TurbineFile}), validated there, immutable after.
 * The real-time thread copies what it needs into primitives before a run.
 *
 * <p>The file keys are the dotted names in the table (section.key_unit); they are a contract
 * read by other tools.
 *
 * <table>
 *   <caption>Parameters</caption>
 *   <tr><th>field</th><th>file key</th><th>unit</th></tr>
 *   <tr><td>airDensityKgPerM3</td><td>rotor.air_density_kg_m3</td><td>kg/m3</td></tr>
 *   <tr><td>rotorRadiusM</td><td>rotor.radius_m</td><td>m</td></tr>
 *   <tr><td>cpC1..cpC9, cpX</td><td>rotor.cp_c1 .. rotor.cp_c9, rotor.cp_x</td><td>1 (beta in degrees inside the formula)</td></tr>
 *   <tr><td>cutInWindMPerS, ratedWindMPerS, cutOutWindMPerS</td><td>rotor.cut_in_wind_m_s, rotor.rated_wind_m_s, rotor.cut_out_wind_m_s</td><td>m/s</td></tr>
 *   <tr><td>ratedRotorSpeedRadPerS, minRotorSpeedRadPerS, overspeedTripRadPerS</td><td>rotor.rated_speed_rad_s, rotor.min_speed_rad_s, rotor.overspeed_trip_rad_s</td><td>rad/s</td></tr>
 *   <tr><td>pitchMinRad, pitchMaxRad</td><td>pitch.min_rad, pitch.max_rad</td><td>rad</td></tr>
 *   <tr><td>pitchRateMaxRadPerS</td><td>pitch.rate_max_rad_s</td><td>rad/s</td></tr>
 *   <tr><td>pitchServoTimeConstantS</td><td>pitch.servo_time_constant_s</td><td>s</td></tr>
 *   <tr><td>rotorInertiaKgM2, generatorInertiaKgM2</td><td>drivetrain.rotor_inertia_kg_m2, drivetrain.generator_inertia_kg_m2</td><td>kg m2</td></tr>
 *   <tr><td>twoMass</td><td>drivetrain.two_mass (0 or 1)</td><td>-</td></tr>
 *   <tr><td>shaftStiffnessNmPerRad</td><td>drivetrain.shaft_stiffness_nm_rad</td><td>N m/rad</td></tr>
 *   <tr><td>shaftDampingNmsPerRad</td><td>drivetrain.shaft_damping_nms_rad</td><td>N m s/rad</td></tr>
 *   <tr><td>frictionNmsPerRad</td><td>drivetrain.friction_nms_rad</td><td>N m s/rad</td></tr>
 *   <tr><td>gearRatio</td><td>drivetrain.gear_ratio</td><td>1 (1 = direct drive)</td></tr>
 *   <tr><td>ratedPowerW</td><td>generator.rated_power_w</td><td>W</td></tr>
 *   <tr><td>polePairs</td><td>generator.pole_pairs</td><td>1</td></tr>
 *   <tr><td>statorResistanceOhm</td><td>generator.stator_resistance_ohm</td><td>ohm</td></tr>
 *   <tr><td>dAxisInductanceH, qAxisInductanceH</td><td>generator.ld_h, generator.lq_h</td><td>H</td></tr>
 *   <tr><td>magnetFluxWb</td><td>generator.magnet_flux_wb (peak, amplitude-invariant dq)</td><td>Wb</td></tr>
 *   <tr><td>ratedStatorVoltageV</td><td>generator.rated_voltage_v (line-to-line rms)</td><td>V</td></tr>
 *   <tr><td>dcCapacitanceF</td><td>dc_link.capacitance_f</td><td>F</td></tr>
 *   <tr><td>dcVoltageNominalV</td><td>dc_link.nominal_voltage_v</td><td>V</td></tr>
 *   <tr><td>chopperResistanceOhm</td><td>dc_link.chopper_resistance_ohm</td><td>ohm</td></tr>
 *   <tr><td>dcOvervoltageTripV</td><td>dc_link.overvoltage_trip_v</td><td>V</td></tr>
 *   <tr><td>mscCurrentTripA, gscCurrentTripA</td><td>converter.msc_current_trip_a, converter.gsc_current_trip_a (peak phase)</td><td>A</td></tr>
 *   <tr><td>converterRatedCurrentA</td><td>converter.rated_current_a (rms, grid side)</td><td>A</td></tr>
 *   <tr><td>switchingFrequencyHz</td><td>converter.switching_frequency_hz</td><td>Hz</td></tr>
 *   <tr><td>chokeInductanceH, chokeResistanceOhm</td><td>grid_filter.inductance_h, grid_filter.resistance_ohm</td><td>H, ohm</td></tr>
 *   <tr><td>lvVoltageV</td><td>converter_transformer.lv_voltage_v (line-to-line rms)</td><td>V</td></tr>
 *   <tr><td>mvVoltageV</td><td>converter_transformer.mv_voltage_v</td><td>V</td></tr>
 *   <tr><td>converterTransformerRatingVA</td><td>converter_transformer.rating_va</td><td>VA</td></tr>
 *   <tr><td>converterTransformerShortCircuitPu</td><td>converter_transformer.short_circuit_pu</td><td>pu</td></tr>
 *   <tr><td>converterTransformerXOverR</td><td>converter_transformer.x_over_r</td><td>1</td></tr>
 *   <tr><td>hvVoltageV</td><td>plant_transformer.hv_voltage_v</td><td>V</td></tr>
 *   <tr><td>plantTransformerRatingVA</td><td>plant_transformer.rating_va</td><td>VA</td></tr>
 *   <tr><td>plantTransformerShortCircuitPu</td><td>plant_transformer.short_circuit_pu</td><td>pu</td></tr>
 *   <tr><td>plantTransformerXOverR</td><td>plant_transformer.x_over_r</td><td>1</td></tr>
 *   <tr><td>gridFrequencyHz</td><td>grid.frequency_hz</td><td>Hz</td></tr>
 *   <tr><td>shortCircuitRatio</td><td>grid.short_circuit_ratio</td><td>1</td></tr>
 *   <tr><td>gridXOverR</td><td>grid.x_over_r</td><td>1</td></tr>
 *   <tr><td>currentFilterTimeConstantS, voltageFilterTimeConstantS</td><td>measurement.current_filter_s, measurement.voltage_filter_s</td><td>s</td></tr>
 * </table>
 */
public final class TurbineParameters {
    public final double airDensityKgPerM3;
    public final double rotorRadiusM;
    public final double cpC1, cpC2, cpC3, cpC4, cpC5, cpC6, cpC7, cpC8, cpC9, cpX;
    public final double cutInWindMPerS, ratedWindMPerS, cutOutWindMPerS;
    public final double ratedRotorSpeedRadPerS, minRotorSpeedRadPerS, overspeedTripRadPerS;
    public final double pitchMinRad, pitchMaxRad, pitchRateMaxRadPerS, pitchServoTimeConstantS;
    public final double rotorInertiaKgM2, generatorInertiaKgM2;
    public final boolean twoMass;
    public final double shaftStiffnessNmPerRad, shaftDampingNmsPerRad, frictionNmsPerRad, gearRatio;
    public final double ratedPowerW;
    public final int polePairs;
    public final double statorResistanceOhm, dAxisInductanceH, qAxisInductanceH, magnetFluxWb, ratedStatorVoltageV;
    public final double dcCapacitanceF, dcVoltageNominalV, chopperResistanceOhm, dcOvervoltageTripV;
    public final double mscCurrentTripA, gscCurrentTripA, converterRatedCurrentA, switchingFrequencyHz;
    public final double chokeInductanceH, chokeResistanceOhm;
    public final double lvVoltageV, mvVoltageV, converterTransformerRatingVA, converterTransformerShortCircuitPu, converterTransformerXOverR;
    public final double hvVoltageV, plantTransformerRatingVA, plantTransformerShortCircuitPu, plantTransformerXOverR;
    public final double gridFrequencyHz, shortCircuitRatio, gridXOverR;
    public final double currentFilterTimeConstantS, voltageFilterTimeConstantS;

    /** The flat key/value map this instance was built from (file order kept), read-only. */
    private final Map<String, Double> source;

    /**
     * Builds from flat dotted keys (see the class table). Every key is required here; defaults,
     * range and consistency checks with file/key/reason messages belong to the loader.
     *
     * @throws IllegalArgumentException naming the first missing key
     */
    public TurbineParameters(Map<String, Double> v) {
        source = Collections.unmodifiableMap(new LinkedHashMap<>(v));
        airDensityKgPerM3 = req(v, "rotor.air_density_kg_m3");
        rotorRadiusM = req(v, "rotor.radius_m");
        cpC1 = req(v, "rotor.cp_c1"); cpC2 = req(v, "rotor.cp_c2"); cpC3 = req(v, "rotor.cp_c3");
        cpC4 = req(v, "rotor.cp_c4"); cpC5 = req(v, "rotor.cp_c5"); cpC6 = req(v, "rotor.cp_c6");
        cpC7 = req(v, "rotor.cp_c7"); cpC8 = req(v, "rotor.cp_c8"); cpC9 = req(v, "rotor.cp_c9");
        cpX = req(v, "rotor.cp_x");
        cutInWindMPerS = req(v, "rotor.cut_in_wind_m_s");
        ratedWindMPerS = req(v, "rotor.rated_wind_m_s");
        cutOutWindMPerS = req(v, "rotor.cut_out_wind_m_s");
        ratedRotorSpeedRadPerS = req(v, "rotor.rated_speed_rad_s");
        minRotorSpeedRadPerS = req(v, "rotor.min_speed_rad_s");
        overspeedTripRadPerS = req(v, "rotor.overspeed_trip_rad_s");
        pitchMinRad = req(v, "pitch.min_rad");
        pitchMaxRad = req(v, "pitch.max_rad");
        pitchRateMaxRadPerS = req(v, "pitch.rate_max_rad_s");
        pitchServoTimeConstantS = req(v, "pitch.servo_time_constant_s");
        rotorInertiaKgM2 = req(v, "drivetrain.rotor_inertia_kg_m2");
        generatorInertiaKgM2 = req(v, "drivetrain.generator_inertia_kg_m2");
        twoMass = req(v, "drivetrain.two_mass") != 0.0;
        shaftStiffnessNmPerRad = req(v, "drivetrain.shaft_stiffness_nm_rad");
        shaftDampingNmsPerRad = req(v, "drivetrain.shaft_damping_nms_rad");
        frictionNmsPerRad = req(v, "drivetrain.friction_nms_rad");
        gearRatio = req(v, "drivetrain.gear_ratio");
        ratedPowerW = req(v, "generator.rated_power_w");
        polePairs = (int) Math.round(req(v, "generator.pole_pairs"));
        statorResistanceOhm = req(v, "generator.stator_resistance_ohm");
        dAxisInductanceH = req(v, "generator.ld_h");
        qAxisInductanceH = req(v, "generator.lq_h");
        magnetFluxWb = req(v, "generator.magnet_flux_wb");
        ratedStatorVoltageV = req(v, "generator.rated_voltage_v");
        dcCapacitanceF = req(v, "dc_link.capacitance_f");
        dcVoltageNominalV = req(v, "dc_link.nominal_voltage_v");
        chopperResistanceOhm = req(v, "dc_link.chopper_resistance_ohm");
        dcOvervoltageTripV = req(v, "dc_link.overvoltage_trip_v");
        mscCurrentTripA = req(v, "converter.msc_current_trip_a");
        gscCurrentTripA = req(v, "converter.gsc_current_trip_a");
        converterRatedCurrentA = req(v, "converter.rated_current_a");
        switchingFrequencyHz = req(v, "converter.switching_frequency_hz");
        chokeInductanceH = req(v, "grid_filter.inductance_h");
        chokeResistanceOhm = req(v, "grid_filter.resistance_ohm");
        lvVoltageV = req(v, "converter_transformer.lv_voltage_v");
        mvVoltageV = req(v, "converter_transformer.mv_voltage_v");
        converterTransformerRatingVA = req(v, "converter_transformer.rating_va");
        converterTransformerShortCircuitPu = req(v, "converter_transformer.short_circuit_pu");
        converterTransformerXOverR = req(v, "converter_transformer.x_over_r");
        hvVoltageV = req(v, "plant_transformer.hv_voltage_v");
        plantTransformerRatingVA = req(v, "plant_transformer.rating_va");
        plantTransformerShortCircuitPu = req(v, "plant_transformer.short_circuit_pu");
        plantTransformerXOverR = req(v, "plant_transformer.x_over_r");
        gridFrequencyHz = req(v, "grid.frequency_hz");
        shortCircuitRatio = req(v, "grid.short_circuit_ratio");
        gridXOverR = req(v, "grid.x_over_r");
        currentFilterTimeConstantS = req(v, "measurement.current_filter_s");
        voltageFilterTimeConstantS = req(v, "measurement.voltage_filter_s");
    }

    /**
     * Every value by its file key (the map this instance was built from), read-only. Used by
     * {@code galebench turbine show} and to derive variants with {@link #with}.
     */
    public Map<String, Double> values() {
        return source;
    }

    /**
     * A copy with one value replaced (for tests and studies, e.g. a salient machine or a weak
     * grid). Not validated again: run {@link TurbineFile#validate} on the result if the value
     * comes from a user.
     *
     * @throws IllegalArgumentException if {@code key} is not a parameter key
     */
    public TurbineParameters with(String key, double value) {
        if (!source.containsKey(key)) {
            throw new IllegalArgumentException("unknown turbine parameter '" + key + "'");
        }
        Map<String, Double> copy = new LinkedHashMap<>(source);
        copy.put(key, value);
        return new TurbineParameters(copy);
    }

    private static double req(Map<String, Double> v, String key) {
        Double d = v.get(key);
        if (d == null) {
            throw new IllegalArgumentException("missing turbine parameter '" + key + "'");
        }
        return d;
    }
}
