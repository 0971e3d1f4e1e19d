package dev.galebench.plant;

/**
 * A fixed-step plant as the real-time loop and the sequence runner see it. Implementations
 * step in place on primitive state; {@link #step}, {@link #sense}, {@link #sample} and every
 * setter allocate nothing, lock nothing and never throw for control flow, so they may be
 * called from the real-time thread. With the same inputs a plant is bit-for-bit deterministic.
 *
 * <p>The setters are the programmable inputs a sequence drives (wind, grid source, grid
 * strength, plant-level references). They take effect at the next {@link #step}.
 */
public interface PlantModel {
    /** Fixed step of {@link #step}, in nanoseconds. */
    long stepPeriodNs();

    /** Plant time: number of steps taken times the step. */
    long plantTimeNs();

    /** Advances the plant by one step, holding {@code command} constant over it. */
    void step(BoardCommand command);

    /** Writes what the board's sensors see now into {@code out}. */
    void sense(SensorView out);

    /** Number of recordable signals written by {@link #sample}. */
    int signalCount();

    /** Name of signal {@code index} (stable, snake_case with a unit suffix, e.g. {@code v_dc_v}). */
    String signalName(int index);

    /** Unit of signal {@code index} (SI symbol, e.g. {@code V}, {@code A}, {@code rad/s}, {@code 1}). */
    String signalUnit(int index);

    /** Writes the current value of every recordable signal into {@code out[0 .. signalCount())}. */
    void sample(double[] out);

    /** Latched trip bits ({@code SensorView.TRIP_*}); 0 when healthy. */
    int tripFlags();

    /** Hub-height wind speed, m/s. */
    void setWindSpeed(double windSpeedMPerS);

    /** Grid source (Thevenin EMF) magnitude per phase, per unit of nominal. Unequal values make an unbalanced dip. */
    void setGridVoltagePu(double phaseAPu, double phaseBPu, double phaseCPu);

    /** Grid source phase offset against its nominal rotating angle, rad (a step here is a phase jump). */
    void setGridPhaseOffsetRad(double phaseOffsetRad);

    /** Grid source frequency, Hz. */
    void setGridFrequencyHz(double frequencyHz);

    /** Grid strength at the point of connection: short-circuit ratio (S_sc / P_rated) and X/R. */
    void setGridStrength(double shortCircuitRatio, double xOverR);

    /** Plant-level controller's voltage-deviation reference sent to the board, pu. */
    void setVoltageDeviationRefPu(double deviationPu);

    /** Blocks both converters and latches {@code tripBit} (used by the link watchdog). */
    void forceTrip(int tripBit);
}
