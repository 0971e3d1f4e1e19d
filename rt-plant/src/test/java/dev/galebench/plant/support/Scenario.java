package dev.galebench.plant.support;

import dev.galebench.plant.PlantModel;

/**
 * A scripted, allocation-free sequence of plant inputs by step index (for determinism and
 * allocation tests): wind step, unbalanced dip, phase jump, frequency step, grid-strength
 * change, voltage-deviation reference. Times assume the given step period.
 */
public final class Scenario {
    private final long stepsPerSecond;

    public Scenario(long stepPeriodNs) {
        this.stepsPerSecond = 1_000_000_000L / stepPeriodNs;
    }

    /** Applies the inputs due before step {@code k}; periodic with a 2-second cycle. */
    public void apply(long k, PlantModel plant) {
        final long c = k % (2 * stepsPerSecond);
        final long ms = c * 1000 / stepsPerSecond;
        if (c == 0) {
            plant.setWindSpeed(9.0);
            plant.setGridVoltagePu(1.0, 1.0, 1.0);
            plant.setGridPhaseOffsetRad(0.0);
            plant.setGridFrequencyHz(50.0);
            plant.setGridStrength(10.0, 10.0);
        } else if (ms == 200 && c % (stepsPerSecond / 1000) == 0) {
            plant.setWindSpeed(9.5);
        } else if (ms == 500 && c % (stepsPerSecond / 1000) == 0) {
            plant.setGridVoltagePu(0.95, 0.9, 0.97);
        } else if (ms == 700 && c % (stepsPerSecond / 1000) == 0) {
            plant.setGridVoltagePu(1.0, 1.0, 1.0);
            plant.setGridPhaseOffsetRad(0.05);
        } else if (ms == 1000 && c % (stepsPerSecond / 1000) == 0) {
            plant.setGridFrequencyHz(50.2);
            plant.setVoltageDeviationRefPu(0.01);
        } else if (ms == 1500 && c % (stepsPerSecond / 1000) == 0) {
            plant.setGridStrength(5.0, 7.0);
        }
    }
}
