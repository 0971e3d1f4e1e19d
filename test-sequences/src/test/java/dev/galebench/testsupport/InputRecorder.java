package dev.galebench.testsupport;

import dev.galebench.plant.BoardCommand;
import dev.galebench.plant.PlantModel;
import dev.galebench.plant.SensorView;

/**
 * Observes what a step hook applies to a plant's programmable inputs: it keeps the last value
 * of every setter and counts the calls, in primitive fields (so allocation tests stay clean).
 * It has no physics: tests of the schedule judge which input is set to what at which step.
 */
public final class InputRecorder implements PlantModel {
    public double wind = Double.NaN, va = Double.NaN, vb = Double.NaN, vc = Double.NaN;
    public double phaseRad = Double.NaN, frequencyHz = Double.NaN, scr = Double.NaN, xOverR = Double.NaN;
    public double vdevPu = Double.NaN;
    public long windCalls, voltageCalls, phaseCalls, frequencyCalls, strengthCalls, vdevCalls;
    public int trip;

    @Override public long stepPeriodNs() { return 50_000; }
    @Override public long plantTimeNs() { return 0; }
    @Override public void step(BoardCommand command) { }
    @Override public void sense(SensorView out) { }
    @Override public int signalCount() { return 0; }
    @Override public String signalName(int index) { throw new IndexOutOfBoundsException(index); }
    @Override public String signalUnit(int index) { throw new IndexOutOfBoundsException(index); }
    @Override public void sample(double[] out) { }
    @Override public int tripFlags() { return trip; }
    @Override public void setWindSpeed(double v) { wind = v; windCalls++; }
    @Override public void setGridVoltagePu(double a, double b, double c) { va = a; vb = b; vc = c; voltageCalls++; }
    @Override public void setGridPhaseOffsetRad(double r) { phaseRad = r; phaseCalls++; }
    @Override public void setGridFrequencyHz(double f) { frequencyHz = f; frequencyCalls++; }
    @Override public void setGridStrength(double s, double x) { scr = s; xOverR = x; strengthCalls++; }
    @Override public void setVoltageDeviationRefPu(double d) { vdevPu = d; vdevCalls++; }
    @Override public void forceTrip(int tripBit) { trip |= tripBit; }
}
