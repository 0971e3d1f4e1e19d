package dev.galebench.plant.support;

import dev.galebench.plant.BoardCommand;
import dev.galebench.plant.OperatingPoint;
import dev.galebench.plant.TurbinePlant;

/**
 * Open-loop driver for tests: holds the converter voltages of an operating point fixed in
 * their rotating frames (rotor frame for the machine side, true grid-source frame for the grid
 * side) and computes the duties at the middle of each coming step from the plant's true
 * angles, with the measured DC voltage. No feedback on currents or power.
 */
public final class SteadyDriver {
    private final TurbinePlant plant;
    private final OperatingPoint op;
    private final BoardCommand command = new BoardCommand();
    private final double halfStepS;

    public SteadyDriver(TurbinePlant plant, OperatingPoint op) {
        this.plant = plant;
        this.op = op;
        this.halfStepS = 0.5 * plant.stepPeriodNs() * 1e-9;
    }

    /** The command for the coming step (reused instance). */
    public BoardCommand command() {
        final double thetaE = plant.generatorElectricalAngleRad() + halfStepS * plant.generatorElectricalSpeedRadPerS();
        final double thetaG = plant.gridAngleRad() + halfStepS * plant.gridAngularFrequencyRadPerS();
        op.fillCommand(command, thetaE, thetaG, plant.dcLinkVoltageV());
        return command;
    }

    /** Steps the plant {@code steps} times with the open-loop command. */
    public void run(long steps) {
        for (long i = 0; i < steps; i++) {
            plant.step(command());
        }
    }
}
