package dev.galebench.support;

import dev.galebench.plant.SensorView;

/** Sensor views with plausible numbers of our own demo turbine (690 V grid side, 1.1 kV DC link). */
public final class SensorViews {
    private SensorViews() {
    }

    /** A view at plant time {@code k} * 50 us, values varying with {@code k} so frames differ. */
    public static SensorView sample(long k) {
        final SensorView v = new SensorView();
        fill(v, k);
        return v;
    }

    /** Overwrites {@code v} in place (allocation-free). */
    public static void fill(SensorView v, long k) {
        final double wt = 2 * Math.PI * 50.0 * k * 50e-6;
        final double third = 2 * Math.PI / 3;
        v.plantTimeNs = k * 50_000L;
        v.gridVoltageAV = 563.4 * Math.sin(wt);
        v.gridVoltageBV = 563.4 * Math.sin(wt - third);
        v.gridVoltageCV = 563.4 * Math.sin(wt + third);
        v.gridCurrentAA = 1250.5 * Math.sin(wt + 0.1);
        v.gridCurrentBA = 1250.5 * Math.sin(wt + 0.1 - third);
        v.gridCurrentCA = 1250.5 * Math.sin(wt + 0.1 + third);
        v.statorVoltageAV = 480.2 * Math.cos(wt * 0.8);
        v.statorVoltageBV = 480.2 * Math.cos(wt * 0.8 - third);
        v.statorVoltageCV = 480.2 * Math.cos(wt * 0.8 + third);
        v.statorCurrentAA = -900.25 * Math.cos(wt * 0.8);
        v.statorCurrentBA = -900.25 * Math.cos(wt * 0.8 - third);
        v.statorCurrentCA = -900.25 * Math.cos(wt * 0.8 + third);
        v.dcLinkVoltageV = 1100.0 + 0.1 * (k % 7);
        v.rotorAngleRad = (0.001 * k) % (2 * Math.PI);
        v.rotorSpeedRadPerS = 157.08;
        v.windSpeedMPerS = 9.5;
        v.pitchAngleRad = 0.0175;
        v.gridVoltageDV = 563.4;
        v.gridVoltageQV = 0.5;
        v.gridCurrentDA = 1250.5;
        v.gridCurrentQA = -20.0;
        v.statorCurrentDA = -10.0;
        v.statorCurrentQA = 900.25;
        v.statorVoltageDV = -30.0;
        v.statorVoltageQV = 480.2;
        v.voltageDeviationRefPu = 0.02;
        v.statusFlags = SensorView.STATUS_BREAKER_CLOSED;
    }
}
