package dev.galebench.plant;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import java.util.LinkedHashMap;
import java.util.Map;

/**
 * A settled operating point of the turbine, made by {@link SteadyState#solve}. Public fields,
 * SI units as named; read-only by convention. dq quantities are amplitude-invariant (peak):
 * generator quantities in the rotor frame (d on the magnet), grid quantities in the frame of
 * the grid source (d on the source voltage of phase a), both at angle 0 when the plant is
 * initialised. Currents: generator convention (out of the stator), grid current from the
 * converter towards the grid. Reactive power positive = capacitive (over-excited) injection.
 */
public final class OperatingPoint {
    /** Operating region: "idle" (outside cut-in..cut-out), "min-speed", "mppt", "rated-speed" (pitch 0, speed held), "pitch". */
    public String region;
    public double windMPerS;
    public double gridVoltagePu;
    public double reactivePowerPu;
    public double rotorRadiusM;
    public double airDensityKgPerM3;

    public double rotorSpeedRadPerS;
    public double generatorSpeedRadPerS;
    public double tipSpeedRatio;
    public double cp;
    public double pitchRad;
    public double aeroPowerW;
    public double aeroTorqueNm;
    /** Electromagnetic (braking) torque on the generator shaft. */
    public double generatorTorqueNm;
    /** Shaft torque, low-speed side. */
    public double shaftTorqueNm;
    /** Shaft twist (two-mass), rad, low-speed side. */
    public double shaftTwistRad;
    public double generatorElectricalSpeedRadPerS;

    public double statorCurrentDA, statorCurrentQA;
    public double statorVoltageDV, statorVoltageQV;
    public double statorPowerW;

    public double dcLinkVoltageV;

    public double gridCurrentDA, gridCurrentQA;
    public double converterVoltageDV, converterVoltageQV;
    public double terminalVoltageDV, terminalVoltageQV;
    public double pocVoltageDV, pocVoltageQV;
    public double sourceVoltageDV;
    public double gridPowerW, gridReactivePowerVar;
    public double pocPowerW, pocReactivePowerVar;
    public double terminalVoltagePu, pocVoltagePu;

    public double statorCopperLossW, chokeLossW, transformerLossW, frictionLossW;
    /** Every loss between the rotor and the point of connection: p_aero_w = p_poc_w + losses_w. */
    public double lossesW;

    /** Peak phase voltage over the linear SVPWM limit Vdc / sqrt(3) (1 = limit). */
    public double mscModulation, gscModulation;
    /** Duties at angle 0 (the initial angles of an initialised plant). */
    public double mscDutyA, mscDutyB, mscDutyC, gscDutyA, gscDutyB, gscDutyC;

    OperatingPoint() {
    }

    public double pitchDeg() {
        return Math.toDegrees(pitchRad);
    }

    /**
     * Writes the command that holds this point: converters enabled, breaker closed, chopper
     * off, pitch reference at the settled pitch, and duties for the settled converter voltages
     * at the given angles and DC voltage (the angles of the instant the duties apply, e.g. the
     * middle of the next step). Allocation-free.
     */
    public void fillCommand(BoardCommand cmd, double generatorElectricalAngleRad, double gridAngleRad, double dcVoltageV) {
        Modulation.mscDuties(cmd, statorVoltageDV, statorVoltageQV, generatorElectricalAngleRad, dcVoltageV);
        Modulation.gscDuties(cmd, converterVoltageDV, converterVoltageQV, gridAngleRad, dcVoltageV);
        cmd.chopperDuty = 0.0;
        cmd.pitchRefRad = pitchRad;
        cmd.commandFlags = BoardCommand.CMD_MSC_ENABLE | BoardCommand.CMD_GSC_ENABLE | BoardCommand.CMD_BREAKER_CLOSE;
    }

    /** The point as an ordered map with snake_case keys carrying units (the JSON of {@code turbine steady}). */
    public Map<String, Object> toMap() {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("region", region);
        m.put("wind_m_s", windMPerS);
        m.put("grid_voltage_pu", gridVoltagePu);
        m.put("reactive_power_pu", reactivePowerPu);
        m.put("rotor_radius_m", rotorRadiusM);
        m.put("air_density_kg_m3", airDensityKgPerM3);
        m.put("rotor_speed_rad_s", rotorSpeedRadPerS);
        m.put("rotor_speed_rpm", rotorSpeedRadPerS * 30.0 / Math.PI);
        m.put("generator_speed_rad_s", generatorSpeedRadPerS);
        m.put("tip_speed_ratio", tipSpeedRatio);
        m.put("cp", cp);
        m.put("pitch_deg", pitchDeg());
        m.put("p_aero_w", aeroPowerW);
        m.put("t_aero_nm", aeroTorqueNm);
        m.put("t_gen_nm", generatorTorqueNm);
        m.put("t_shaft_nm", shaftTorqueNm);
        m.put("i_stator_d_a", statorCurrentDA);
        m.put("i_stator_q_a", statorCurrentQA);
        m.put("v_stator_d_v", statorVoltageDV);
        m.put("v_stator_q_v", statorVoltageQV);
        m.put("p_stator_w", statorPowerW);
        m.put("v_dc_v", dcLinkVoltageV);
        m.put("i_grid_d_a", gridCurrentDA);
        m.put("i_grid_q_a", gridCurrentQA);
        m.put("v_conv_d_v", converterVoltageDV);
        m.put("v_conv_q_v", converterVoltageQV);
        m.put("v_term_d_v", terminalVoltageDV);
        m.put("v_term_q_v", terminalVoltageQV);
        m.put("v_term_pu", terminalVoltagePu);
        m.put("p_grid_w", gridPowerW);
        m.put("q_grid_var", gridReactivePowerVar);
        m.put("p_poc_w", pocPowerW);
        m.put("q_poc_var", pocReactivePowerVar);
        m.put("v_poc_pu", pocVoltagePu);
        m.put("stator_copper_loss_w", statorCopperLossW);
        m.put("choke_loss_w", chokeLossW);
        m.put("transformer_loss_w", transformerLossW);
        m.put("friction_loss_w", frictionLossW);
        m.put("losses_w", lossesW);
        m.put("msc_modulation", mscModulation);
        m.put("gsc_modulation", gscModulation);
        m.put("msc_duty_a", mscDutyA);
        m.put("msc_duty_b", mscDutyB);
        m.put("msc_duty_c", mscDutyC);
        m.put("gsc_duty_a", gscDutyA);
        m.put("gsc_duty_b", gscDutyB);
        m.put("gsc_duty_c", gscDutyC);
        return m;
    }

    /** {@link #toMap()} as pretty-printed JSON. */
    public String toJson() {
        try {
            return new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT).writeValueAsString(toMap());
        } catch (JsonProcessingException e) {
            throw new IllegalStateException(e);
        }
    }
}
