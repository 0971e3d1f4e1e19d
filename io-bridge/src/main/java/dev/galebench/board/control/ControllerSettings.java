package dev.galebench.board.control;

import java.util.Map;

/**
 * The reference controller's own settings: rise times, thresholds, k-factor, limits. Built once
 * (by {@link ControllerFile}, which validates ranges and consistency with file/key/reason
 * messages), immutable after. Everything else the controller needs comes from the turbine file
 * ({@code TurbineParameters}); {@link ControllerTuning} turns both into gains.
 *
 * <p>Per-unit quantities: voltages in pu of the nominal grid voltage (peak phase on the LV side),
 * grid currents in pu of the converter's rated current (peak), stator currents in pu of the
 * generator's rated current, DC voltage in pu of the nominal DC voltage.
 *
 * <table>
 *   <caption>Settings (file key = section.key)</caption>
 *   <tr><th>field</th><th>file key</th><th>unit</th><th>default, why</th></tr>
 *   <tr><td>mscCurrentRiseTimeS</td><td>msc.current_rise_time_s</td><td>s</td><td>0.020, common practice</td></tr>
 *   <tr><td>mscCurrentLimitPu</td><td>msc.current_limit_pu</td><td>pu</td><td>1.2 (machine side, short time)</td></tr>
 *   <tr><td>speedFilterS</td><td>msc.speed_filter_s</td><td>s</td><td>0.05</td></tr>
 *   <tr><td>torqueTransitionSpeedPu</td><td>msc.torque_transition_speed_pu</td><td>pu of rated speed</td><td>0.95: start of the linear torque ramp to rated torque</td></tr>
 *   <tr><td>gscCurrentRiseTimeS</td><td>gsc.current_rise_time_s</td><td>s</td><td>0.010, common practice</td></tr>
 *   <tr><td>gscCurrentLimitPu</td><td>gsc.current_limit_pu</td><td>pu</td><td>1.0 continuous (REFERENCES.md 7, i_max)</td></tr>
 *   <tr><td>gscCurrentLimitFrtPu</td><td>gsc.current_limit_frt_pu</td><td>pu</td><td>1.1 during a fault (i_maxdip)</td></tr>
 *   <tr><td>feedForwardFilterS</td><td>gsc.feed_forward_filter_s</td><td>s</td><td>0.0002</td></tr>
 *   <tr><td>modulationLimitPu</td><td>gsc.modulation_limit_pu</td><td>pu of Vdc/sqrt3</td><td>0.98 (also used by the MSC)</td></tr>
 *   <tr><td>dcVoltageRefPu</td><td>dc_voltage.reference_pu</td><td>pu</td><td>1.0</td></tr>
 *   <tr><td>dcNaturalFrequencyHz</td><td>dc_voltage.natural_frequency_hz</td><td>Hz</td><td>5</td></tr>
 *   <tr><td>dcDampingRatio</td><td>dc_voltage.damping_ratio</td><td>1</td><td>0.8</td></tr>
 *   <tr><td>dcVoltageFilterS</td><td>dc_voltage.filter_s</td><td>s</td><td>0.0005</td></tr>
 *   <tr><td>voltageLoopGainPu</td><td>reactive.voltage_gain_pu</td><td>pu current / pu voltage</td><td>2.0</td></tr>
 *   <tr><td>voltageFilterS</td><td>reactive.voltage_filter_s</td><td>s</td><td>0.001 (magnitude filter; short, so the reactive current falls at once when the voltage returns)</td></tr>
 *   <tr><td>voltageReferenceFilterS</td><td>reactive.reference_filter_s</td><td>s</td><td>60: pre-fault mean voltage (VDE-AR-N 4120, 1-min mean, from memory)</td></tr>
 *   <tr><td>pllNaturalFrequencyHz</td><td>pll.natural_frequency_hz</td><td>Hz</td><td>8</td></tr>
 *   <tr><td>pllDampingRatio</td><td>pll.damping_ratio</td><td>1</td><td>0.707</td></tr>
 *   <tr><td>pllNormFloorPu</td><td>pll.normalisation_floor_pu</td><td>pu</td><td>0.2</td></tr>
 *   <tr><td>frtEnterPu</td><td>frt.enter_deviation_pu</td><td>pu</td><td>0.10 (TransmissionCode 2007 dead band, from memory)</td></tr>
 *   <tr><td>frtExitPu</td><td>frt.exit_deviation_pu</td><td>pu</td><td>0.08</td></tr>
 *   <tr><td>frtHoldS</td><td>frt.hold_s</td><td>s</td><td>0.1 (common practice 0.1-0.5)</td></tr>
 *   <tr><td>kFactor</td><td>frt.k_factor</td><td>1</td><td>2 (TransmissionCode 2007 / VDE-AR-N 4120)</td></tr>
 *   <tr><td>negativeSequenceK</td><td>frt.negative_sequence_k</td><td>1</td><td>2 (VDE-AR-N 4120/4110: additional negative-sequence reactive current delta i2 = k2 delta u2, k2 like the positive k, from memory); 0 = balanced currents (i2* = 0)</td></tr>
 *   <tr><td>activeRecoveryRatePuPerS</td><td>frt.active_recovery_rate_pu_s</td><td>pu/s</td><td>2.0</td></tr>
 *   <tr><td>chopperOnPu, chopperOffPu</td><td>chopper.on_pu, chopper.off_pu</td><td>pu of Vdc nominal</td><td>1.10, 1.05 (common practice)</td></tr>
 *   <tr><td>pitchNaturalFrequencyHz</td><td>pitch.natural_frequency_hz</td><td>Hz</td><td>0.1 (Jonkman 2009: 0.6 rad/s)</td></tr>
 *   <tr><td>pitchDampingRatio</td><td>pitch.damping_ratio</td><td>1</td><td>0.7 (Jonkman 2009)</td></tr>
 *   <tr><td>undervoltagePu, undervoltageDelayS</td><td>protection.undervoltage_pu, protection.undervoltage_delay_s</td><td>pu, s</td><td>0.85, 3.0</td></tr>
 *   <tr><td>undervoltageFastPu, undervoltageFastDelayS</td><td>protection.undervoltage_fast_pu, protection.undervoltage_fast_delay_s</td><td>pu, s</td><td>0.30, 0.5</td></tr>
 *   <tr><td>overvoltagePu, overvoltageDelayS</td><td>protection.overvoltage_pu, protection.overvoltage_delay_s</td><td>pu, s</td><td>1.10, 2.0 (IEEE 1547 Table 11 OV1)</td></tr>
 *   <tr><td>overvoltageFastPu, overvoltageFastDelayS</td><td>protection.overvoltage_fast_pu, protection.overvoltage_fast_delay_s</td><td>pu, s</td><td>1.25, 0.1</td></tr>
 *   <tr><td>overcurrentPu, overcurrentDelayS</td><td>protection.overcurrent_pu, protection.overcurrent_delay_s</td><td>pu of the hardware trip, s</td><td>0.9, 0.002</td></tr>
 *   <tr><td>dcOvervoltagePu, dcOvervoltageDelayS</td><td>protection.dc_overvoltage_pu, protection.dc_overvoltage_delay_s</td><td>pu of the hardware trip, s</td><td>0.97, 0.002</td></tr>
 *   <tr><td>angleAdvanceSamples</td><td>timing.angle_advance_samples</td><td>control periods</td><td>0.5: the command holds over the next period, so its mean lags the sample by half a period (in-process); a board answering one exchange later needs 1.5</td></tr>
 *   <tr><td>windFilterS</td><td>protection.wind_filter_s</td><td>s</td><td>3</td></tr>
 *   <tr><td>cutOutDelayS, cutInDelayS</td><td>protection.cut_out_delay_s, protection.cut_in_delay_s</td><td>s</td><td>2, 10</td></tr>
 *   <tr><td>restartHysteresisMPerS</td><td>protection.restart_hysteresis_m_s</td><td>m/s</td><td>3 (cut-out), a quarter of it at cut-in</td></tr>
 * </table>
 */
public final class ControllerSettings {
    public final double mscCurrentRiseTimeS, mscCurrentLimitPu, speedFilterS, torqueTransitionSpeedPu;
    public final double gscCurrentRiseTimeS, gscCurrentLimitPu, gscCurrentLimitFrtPu, feedForwardFilterS, modulationLimitPu;
    public final double dcVoltageRefPu, dcNaturalFrequencyHz, dcDampingRatio, dcVoltageFilterS;
    public final double voltageLoopGainPu, voltageFilterS, voltageReferenceFilterS;
    public final double pllNaturalFrequencyHz, pllDampingRatio, pllNormFloorPu;
    public final double frtEnterPu, frtExitPu, frtHoldS, kFactor, negativeSequenceK, activeRecoveryRatePuPerS;
    public final double chopperOnPu, chopperOffPu;
    public final double pitchNaturalFrequencyHz, pitchDampingRatio;
    public final double undervoltagePu, undervoltageDelayS, undervoltageFastPu, undervoltageFastDelayS;
    public final double overvoltagePu, overvoltageDelayS, overvoltageFastPu, overvoltageFastDelayS;
    public final double overcurrentPu, overcurrentDelayS, dcOvervoltagePu, dcOvervoltageDelayS;
    public final double windFilterS, cutOutDelayS, cutInDelayS, restartHysteresisMPerS;
    public final double angleAdvanceSamples;

    /** From flat dotted keys, all present (the loader merges the defaults in first). */
    ControllerSettings(Map<String, Double> v) {
        mscCurrentRiseTimeS = v.get("msc.current_rise_time_s");
        mscCurrentLimitPu = v.get("msc.current_limit_pu");
        speedFilterS = v.get("msc.speed_filter_s");
        torqueTransitionSpeedPu = v.get("msc.torque_transition_speed_pu");
        gscCurrentRiseTimeS = v.get("gsc.current_rise_time_s");
        gscCurrentLimitPu = v.get("gsc.current_limit_pu");
        gscCurrentLimitFrtPu = v.get("gsc.current_limit_frt_pu");
        feedForwardFilterS = v.get("gsc.feed_forward_filter_s");
        modulationLimitPu = v.get("gsc.modulation_limit_pu");
        dcVoltageRefPu = v.get("dc_voltage.reference_pu");
        dcNaturalFrequencyHz = v.get("dc_voltage.natural_frequency_hz");
        dcDampingRatio = v.get("dc_voltage.damping_ratio");
        dcVoltageFilterS = v.get("dc_voltage.filter_s");
        voltageLoopGainPu = v.get("reactive.voltage_gain_pu");
        voltageFilterS = v.get("reactive.voltage_filter_s");
        voltageReferenceFilterS = v.get("reactive.reference_filter_s");
        pllNaturalFrequencyHz = v.get("pll.natural_frequency_hz");
        pllDampingRatio = v.get("pll.damping_ratio");
        pllNormFloorPu = v.get("pll.normalisation_floor_pu");
        frtEnterPu = v.get("frt.enter_deviation_pu");
        frtExitPu = v.get("frt.exit_deviation_pu");
        frtHoldS = v.get("frt.hold_s");
        kFactor = v.get("frt.k_factor");
        negativeSequenceK = v.get("frt.negative_sequence_k");
        activeRecoveryRatePuPerS = v.get("frt.active_recovery_rate_pu_s");
        chopperOnPu = v.get("chopper.on_pu");
        chopperOffPu = v.get("chopper.off_pu");
        pitchNaturalFrequencyHz = v.get("pitch.natural_frequency_hz");
        pitchDampingRatio = v.get("pitch.damping_ratio");
        undervoltagePu = v.get("protection.undervoltage_pu");
        undervoltageDelayS = v.get("protection.undervoltage_delay_s");
        undervoltageFastPu = v.get("protection.undervoltage_fast_pu");
        undervoltageFastDelayS = v.get("protection.undervoltage_fast_delay_s");
        overvoltagePu = v.get("protection.overvoltage_pu");
        overvoltageDelayS = v.get("protection.overvoltage_delay_s");
        overvoltageFastPu = v.get("protection.overvoltage_fast_pu");
        overvoltageFastDelayS = v.get("protection.overvoltage_fast_delay_s");
        overcurrentPu = v.get("protection.overcurrent_pu");
        overcurrentDelayS = v.get("protection.overcurrent_delay_s");
        dcOvervoltagePu = v.get("protection.dc_overvoltage_pu");
        dcOvervoltageDelayS = v.get("protection.dc_overvoltage_delay_s");
        windFilterS = v.get("protection.wind_filter_s");
        cutOutDelayS = v.get("protection.cut_out_delay_s");
        cutInDelayS = v.get("protection.cut_in_delay_s");
        restartHysteresisMPerS = v.get("protection.restart_hysteresis_m_s");
        angleAdvanceSamples = v.get("timing.angle_advance_samples");
    }
}
