package dev.galebench.rt.support;

import dev.galebench.plant.BoardCommand;
import dev.galebench.plant.PlantModel;
import dev.galebench.plant.SensorView;

/**
 * A small honest plant for loop tests: one first-order state x (think of a DC-link voltage)
 * driven by the grid-side duty, x' = (1000 V * gscDutyA - x) / tau, explicit Euler, plus a
 * first-order pitch servo following the pitch reference. Deterministic, allocation-free, and
 * it latches trips like a real plant (forceTrip, or x above {@link #overvoltageTripV}).
 *
 * <table>
 *   <caption>Signals</caption>
 *   <tr><th>name</th><th>unit</th></tr>
 *   <tr><td>x_v</td><td>V</td></tr>
 *   <tr><td>duty_1</td><td>1</td></tr>
 *   <tr><td>pitch_deg</td><td>deg</td></tr>
 *   <tr><td>wind_m_s</td><td>m/s</td></tr>
 *   <tr><td>trip_flags</td><td>bits</td></tr>
 * </table>
 */
public final class FirstOrderTestPlant implements PlantModel {
    public static final double GAIN_V = 1000.0;
    public static final double TAU_S = 0.01;
    public static final double PITCH_TAU_S = 0.1;
    private static final String[] NAMES = {"x_v", "duty_1", "pitch_deg", "wind_m_s", "trip_flags"};
    private static final String[] UNITS = {"V", "1", "deg", "m/s", "bits"};

    private final long stepPeriodNs;
    private final double dtS;
    public double overvoltageTripV = Double.POSITIVE_INFINITY;
    private long steps;
    private double xV;
    private double duty;
    private double pitchRad;
    private double windMPerS = 8.0;
    private double voltageDeviationRefPu;
    private int tripFlags;
    private int statusFlags = SensorView.STATUS_BREAKER_CLOSED;
    /** Number of forceTrip calls (for tests). */
    public long forceTripCalls;

    public FirstOrderTestPlant(long stepPeriodNs) {
        this.stepPeriodNs = stepPeriodNs;
        this.dtS = stepPeriodNs * 1e-9;
    }

    public double xV() {
        return xV;
    }

    @Override
    public long stepPeriodNs() {
        return stepPeriodNs;
    }

    @Override
    public long plantTimeNs() {
        return steps * stepPeriodNs;
    }

    @Override
    public void step(BoardCommand command) {
        final boolean blocked = tripFlags != 0 || (command.commandFlags & BoardCommand.CMD_GSC_ENABLE) == 0;
        duty = blocked ? 0.5 : command.gscDutyA;
        xV += dtS * (GAIN_V * duty - xV) / TAU_S;
        pitchRad += dtS * (command.pitchRefRad - pitchRad) / PITCH_TAU_S;
        if (xV > overvoltageTripV) {
            tripFlags |= SensorView.TRIP_DC_OVERVOLTAGE;
        }
        if ((command.commandFlags & BoardCommand.CMD_TRIP_RESET) != 0) {
            tripFlags = 0;
        }
        int s = (command.commandFlags & BoardCommand.CMD_BREAKER_CLOSE) != 0 ? SensorView.STATUS_BREAKER_CLOSED : 0;
        if (blocked) {
            s |= SensorView.STATUS_GSC_BLOCKED | SensorView.STATUS_MSC_BLOCKED;
        }
        statusFlags = s;
        steps++;
    }

    @Override
    public void sense(SensorView out) {
        out.plantTimeNs = plantTimeNs();
        out.dcLinkVoltageV = xV;
        out.pitchAngleRad = pitchRad;
        out.windSpeedMPerS = windMPerS;
        out.voltageDeviationRefPu = voltageDeviationRefPu;
        out.statusFlags = statusFlags | tripFlags;
    }

    @Override
    public int signalCount() {
        return NAMES.length;
    }

    @Override
    public String signalName(int index) {
        return NAMES[index];
    }

    @Override
    public String signalUnit(int index) {
        return UNITS[index];
    }

    @Override
    public void sample(double[] out) {
        out[0] = xV;
        out[1] = duty;
        out[2] = Math.toDegrees(pitchRad);
        out[3] = windMPerS;
        out[4] = tripFlags;
    }

    @Override
    public int tripFlags() {
        return tripFlags;
    }

    @Override
    public void setWindSpeed(double windSpeedMPerS) {
        windMPerS = windSpeedMPerS;
    }

    @Override
    public void setGridVoltagePu(double phaseAPu, double phaseBPu, double phaseCPu) {
    }

    @Override
    public void setGridPhaseOffsetRad(double phaseOffsetRad) {
    }

    @Override
    public void setGridFrequencyHz(double frequencyHz) {
    }

    @Override
    public void setGridStrength(double shortCircuitRatio, double xOverR) {
    }

    @Override
    public void setVoltageDeviationRefPu(double deviationPu) {
        voltageDeviationRefPu = deviationPu;
    }

    @Override
    public void forceTrip(int tripBit) {
        tripFlags |= tripBit;
        forceTripCalls++;
    }
}
