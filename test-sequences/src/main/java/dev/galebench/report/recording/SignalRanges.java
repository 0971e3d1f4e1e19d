package dev.galebench.report.recording;

import dev.galebench.plant.BoardCommand;
import dev.galebench.plant.SensorView;
import dev.galebench.plant.TurbineParameters;

import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * Chooses the COMTRADE scaling range of every recorded signal BEFORE the run, from the signal's
 * name and unit and the turbine's ratings, so that a fault (a dip, a trip, an overcurrent) is
 * recorded inside the range instead of saturating a range tuned to the pre-fault second.
 *
 * <p>Why not auto-range from the first second: the first second of a sequence is normally the
 * settled pre-fault operating point, so a range fitted to it would clip exactly the transient the
 * recording is for, and a range widened later would change the scaling half-way through the file,
 * which a COMTRADE file cannot express. The cost of fixed ranges is resolution: a channel spans
 * its range in 65534 steps, e.g. 1.5 x a 3 kA trip level gives 0.14 A per step, far below what a
 * converter's own current sensors resolve.
 *
 * <p>Rules (first match wins; {@code Vn} = peak phase voltage, trip levels are peak values):
 * <table>
 *   <caption>Default ranges</caption>
 *   <tr><th>signal</th><th>range</th><th>unit</th></tr>
 *   <tr><td>caller override</td><td>as passed to {@link #override}</td><td>signal unit</td></tr>
 *   <tr><td>v_dc_v</td><td>0 .. 1.25 x dc overvoltage trip</td><td>V</td></tr>
 *   <tr><td>v_stator_*_v</td><td>+-1.5 x sqrt(2/3) x rated stator voltage</td><td>V</td></tr>
 *   <tr><td>other *_v</td><td>+-1.5 x sqrt(2/3) x LV voltage</td><td>V</td></tr>
 *   <tr><td>i_stator_*_a</td><td>+-1.5 x MSC current trip</td><td>A</td></tr>
 *   <tr><td>other *_a</td><td>+-1.5 x GSC current trip</td><td>A</td></tr>
 *   <tr><td>*_w, *_var</td><td>+-2 x rated power</td><td>W, var</td></tr>
 *   <tr><td>*_nm</td><td>+-3 x rated torque at the shaft the signal is on</td><td>N m</td></tr>
 *   <tr><td>rotor_speed_rad_s / generator_speed_rad_s</td><td>0 .. 1.5 x overspeed trip (x gear ratio)</td><td>rad/s</td></tr>
 *   <tr><td>wind_m_s</td><td>0 .. 1.5 x cut-out wind</td><td>m/s</td></tr>
 *   <tr><td>*_deg</td><td>-30 .. 120</td><td>deg</td></tr>
 *   <tr><td>grid_frequency_hz</td><td>0.8 .. 1.2 x nominal frequency</td><td>Hz</td></tr>
 *   <tr><td>v_*_pu</td><td>0 .. 2 (v_dev_ref_pu: +-1)</td><td>pu</td></tr>
 *   <tr><td>other *_pu</td><td>+-3</td><td>pu</td></tr>
 *   <tr><td>*_duty_*, chopper_duty</td><td>-1.25 .. 1.25</td><td>1</td></tr>
 *   <tr><td>cp</td><td>-1 .. 1</td><td>1</td></tr>
 *   <tr><td>tip_speed_ratio</td><td>0 .. 25</td><td>1</td></tr>
 *   <tr><td>lateness_us, compute_us, rtt_us</td><td>0 .. 20000</td><td>us</td></tr>
 *   <tr><td>reply_age</td><td>0 .. 1000</td><td>exchanges</td></tr>
 *   <tr><td>anything else</td><td>+-1e6, marked "fallback" in the report</td><td>signal unit</td></tr>
 * </table>
 *
 * <p>Status signals ({@code trip_flags}, {@code status_flags}, {@code board_status},
 * {@code frt_active}) are recorded as digital channels, one per bit, see {@link #digitalChannels()}.
 */
public final class SignalRanges implements RangeSource {
    private final TurbineParameters turbine;
    private final Map<String, SignalRange> overrides = new HashMap<>();

    public SignalRanges(TurbineParameters turbine) {
        this.turbine = turbine;
    }

    /** Makes {@code signalName} use {@code range} instead of the rule. Returns this. */
    public SignalRanges override(String signalName, SignalRange range) {
        overrides.put(signalName, range);
        return this;
    }

    /** Names of the signals recorded as digital channels instead of analog ones. */
    public static boolean isStatusSignal(String signalName) {
        return signalName.equals("trip_flags") || signalName.equals("status_flags")
                || signalName.equals("board_status") || signalName.equals("frt_active");
    }

    /** One digital channel per documented bit of each status signal (SensorView and BoardCommand bits). */
    public static List<DigitalChannel> digitalChannels() {
        List<DigitalChannel> list = new ArrayList<>();
        list.add(new DigitalChannel("status_flags", SensorView.STATUS_BREAKER_CLOSED, "breaker_closed", 1));
        list.add(new DigitalChannel("status_flags", SensorView.STATUS_MSC_BLOCKED, "msc_blocked", 0));
        list.add(new DigitalChannel("status_flags", SensorView.STATUS_GSC_BLOCKED, "gsc_blocked", 0));
        list.add(new DigitalChannel("status_flags", SensorView.STATUS_CHOPPER_ON, "chopper_on", 0));
        list.add(new DigitalChannel("trip_flags", SensorView.TRIP_DC_OVERVOLTAGE, "trip_dc_overvoltage", 0));
        list.add(new DigitalChannel("trip_flags", SensorView.TRIP_MSC_OVERCURRENT, "trip_msc_overcurrent", 0));
        list.add(new DigitalChannel("trip_flags", SensorView.TRIP_GSC_OVERCURRENT, "trip_gsc_overcurrent", 0));
        list.add(new DigitalChannel("trip_flags", SensorView.TRIP_LINK_WATCHDOG, "trip_link_watchdog", 0));
        list.add(new DigitalChannel("trip_flags", SensorView.TRIP_OVERSPEED, "trip_overspeed", 0));
        list.add(new DigitalChannel("board_status", BoardCommand.BOARD_RUNNING, "board_running", 1));
        list.add(new DigitalChannel("board_status", BoardCommand.BOARD_TRIPPED, "board_tripped", 0));
        list.add(new DigitalChannel("board_status", BoardCommand.BOARD_PITCH_ACTIVE, "board_pitch_active", 0));
        list.add(new DigitalChannel("board_status", BoardCommand.BOARD_CHOPPER_ON, "board_chopper_on", 0));
        list.add(new DigitalChannel("board_status", BoardCommand.BOARD_PLL_LOCKED, "board_pll_locked", 1));
        list.add(new DigitalChannel("frt_active", 1, "frt_active", 0));
        return list;
    }

    /** The range of one analog signal, by the rules in the class javadoc. */
    @Override
    public SignalRange rangeOf(String name, String unit) {
        SignalRange o = overrides.get(name);
        if (o != null) {
            return o;
        }
        TurbineParameters t = turbine;
        double lvPeakV = Math.sqrt(2.0 / 3.0) * t.lvVoltageV;
        double statorPeakV = Math.sqrt(2.0 / 3.0) * t.ratedStatorVoltageV;
        double ratedRotorTorqueNm = t.ratedPowerW / t.ratedRotorSpeedRadPerS;
        if (name.equals("v_dc_v")) {
            return new SignalRange(0.0, 1.25 * t.dcOvervoltageTripV, "0..1.25 x dc overvoltage trip");
        }
        if (name.endsWith("_pu")) {
            if (name.equals("v_dev_ref_pu")) {
                return SignalRange.symmetric(1.0, "+-1 pu");
            }
            if (name.startsWith("v_")) {
                return new SignalRange(0.0, 2.0, "0..2 pu");
            }
            return SignalRange.symmetric(3.0, "+-3 pu");
        }
        if (name.startsWith("v_stator_") && name.endsWith("_v")) {
            return SignalRange.symmetric(1.5 * statorPeakV, "1.5 x rated stator peak phase voltage");
        }
        if (name.endsWith("_v")) {
            return SignalRange.symmetric(1.5 * lvPeakV, "1.5 x LV peak phase voltage");
        }
        if (name.startsWith("i_stator_") && name.endsWith("_a")) {
            return SignalRange.symmetric(1.5 * t.mscCurrentTripA, "1.5 x MSC current trip");
        }
        if (name.endsWith("_a")) {
            return SignalRange.symmetric(1.5 * t.gscCurrentTripA, "1.5 x GSC current trip");
        }
        if (name.endsWith("_w") || name.endsWith("_var")) {
            return SignalRange.symmetric(2.0 * t.ratedPowerW, "2 x rated power");
        }
        if (name.endsWith("_nm")) {
            if (name.contains("gen")) {
                return SignalRange.symmetric(3.0 * ratedRotorTorqueNm / t.gearRatio, "3 x rated generator torque");
            }
            return SignalRange.symmetric(3.0 * ratedRotorTorqueNm, "3 x rated rotor torque");
        }
        if (name.equals("rotor_speed_rad_s")) {
            return new SignalRange(0.0, 1.5 * t.overspeedTripRadPerS, "0..1.5 x overspeed trip");
        }
        if (name.equals("generator_speed_rad_s")) {
            return new SignalRange(0.0, 1.5 * t.overspeedTripRadPerS * t.gearRatio, "0..1.5 x overspeed trip x gear ratio");
        }
        if (name.equals("wind_m_s")) {
            return new SignalRange(0.0, 1.5 * t.cutOutWindMPerS, "0..1.5 x cut-out wind");
        }
        if (name.endsWith("_deg")) {
            return new SignalRange(-30.0, 120.0, "-30..120 deg");
        }
        if (name.equals("grid_frequency_hz")) {
            return new SignalRange(0.8 * t.gridFrequencyHz, 1.2 * t.gridFrequencyHz, "0.8..1.2 x nominal frequency");
        }
        if (name.contains("_duty")) {
            return SignalRange.symmetric(1.25, "+-1.25");
        }
        if (name.equals("cp")) {
            return SignalRange.symmetric(1.0, "+-1");
        }
        if (name.equals("tip_speed_ratio")) {
            return new SignalRange(0.0, 25.0, "0..25");
        }
        if (name.endsWith("_us")) {
            return new SignalRange(0.0, 20000.0, "0..20 ms");
        }
        if (name.equals("reply_age")) {
            return new SignalRange(0.0, 1000.0, "0..1000 exchanges");
        }
        return SignalRange.symmetric(1.0e6, "fallback +-1e6 (no rule for unit '" + unit + "')");
    }
}
