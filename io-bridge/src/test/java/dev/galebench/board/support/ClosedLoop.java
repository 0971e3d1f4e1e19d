package dev.galebench.board.support;

import dev.galebench.board.control.ControllerSettings;
import dev.galebench.board.control.ReferenceController;
import dev.galebench.plant.BoardCommand;
import dev.galebench.plant.OperatingPoint;
import dev.galebench.plant.SensorView;
import dev.galebench.plant.SteadyState;
import dev.galebench.plant.TurbineParameters;
import dev.galebench.plant.TurbinePlant;
import java.util.HashMap;
import java.util.Map;

/**
 * The reference controller closed with the real plant, offline: at every plant step the plant
 * is sensed, the controller updates, and the plant steps with the new command (exchange every
 * step, h = 50 us unless given). Starts from the plant's own steady state
 * ({@code SteadyState.solve} + {@code TurbinePlant.initialise}).
 */
public final class ClosedLoop {
    public final TurbineParameters turbine;
    public final TurbinePlant plant;
    public final ReferenceController controller;
    public final SensorView view = new SensorView();
    public final BoardCommand command = new BoardCommand();
    public final OperatingPoint start;
    private final double[] signals;
    private final Map<String, Integer> index = new HashMap<>();
    private final double stepS;
    private int exchangeEverySteps = 1;
    private long stepCount;

    public ClosedLoop(TurbineParameters p, ControllerSettings s, double windMPerS, double gridVoltagePu,
            double reactivePowerPu, long stepNs) {
        this(p, s, SteadyState.solve(p, windMPerS, gridVoltagePu, reactivePowerPu), stepNs);
    }

    /**
     * Starts from a given steady state. When it carries reactive power, the plant-level
     * voltage-deviation reference is set to what the controller's proportional voltage loop
     * needs to hold that reactive current (i_r = K_v * dU_ref), so the start is settled.
     */
    public ClosedLoop(TurbineParameters p, ControllerSettings s, OperatingPoint op, long stepNs) {
        turbine = p;
        plant = new TurbinePlant(p, stepNs);
        start = op;
        plant.initialise(start);
        if (op.gridReactivePowerVar != 0.0 && s.voltageLoopGainPu > 0.0) {
            final double vPeak = Math.hypot(op.terminalVoltageDV, op.terminalVoltageQV);
            final double iReactA = op.gridReactivePowerVar / (1.5 * vPeak);
            final double iReactPu = iReactA / (Math.sqrt(2.0) * p.converterRatedCurrentA);
            plant.setVoltageDeviationRefPu(iReactPu / s.voltageLoopGainPu);
        }
        controller = new ReferenceController(p, s);
        stepS = stepNs * 1e-9;
        controller.setSamplePeriod(stepS);
        plant.sense(view);
        controller.start(view);
        signals = new double[plant.signalCount()];
        for (int i = 0; i < plant.signalCount(); i++) {
            index.put(plant.signalName(i), i);
        }
        plant.sample(signals);
    }

    public ClosedLoop(TurbineParameters p, ControllerSettings s, double windMPerS) {
        this(p, s, windMPerS, 1.0, 0.0, 50_000L);
    }

    public double stepS() {
        return stepS;
    }

    /**
     * Exchange with the controller every {@code m} plant steps (a slower link, e.g. serial); the
     * command is held in between. Sets the controller's sample period to {@code m h} and
     * restarts it from the present measurement.
     */
    public ClosedLoop exchangeEvery(int m) {
        exchangeEverySteps = m;
        controller.setSamplePeriod(m * stepS);
        plant.sense(view);
        controller.start(view);
        return this;
    }

    /** One plant step, with an exchange first when one is due; refreshes the signals. */
    public void step() {
        if (stepCount % exchangeEverySteps == 0) {
            plant.sense(view);
            controller.update(view, command);
        }
        stepCount++;
        plant.step(command);
        plant.sample(signals);
    }

    /** Steps for {@code seconds}. */
    public void run(double seconds) {
        final long n = Math.round(seconds / stepS);
        for (long k = 0; k < n; k++) {
            step();
        }
    }

    /**
     * Steps for {@code seconds} and records the named plant signals every {@code every} steps:
     * row 0 is the time (s), row i+1 is {@code names[i]}.
     */
    public double[][] record(double seconds, int every, String... names) {
        final long n = Math.round(seconds / stepS);
        final int rows = (int) (n / every) + 1;
        final double[][] out = new double[names.length + 1][rows];
        final int[] idx = new int[names.length];
        for (int i = 0; i < names.length; i++) {
            idx[i] = signalIndex(names[i]);
        }
        int r = 0;
        for (long k = 1; k <= n; k++) {
            step();
            if (k % every == 0 && r < rows) {
                out[0][r] = timeS();
                for (int i = 0; i < idx.length; i++) {
                    out[i + 1][r] = signals[idx[i]];
                }
                r++;
            }
        }
        if (r < rows) {
            for (int i = 0; i < out.length; i++) {
                out[i] = java.util.Arrays.copyOf(out[i], r);
            }
        }
        return out;
    }

    /** Largest value of {@code row} for times in [from, to]. */
    public static double max(double[][] rec, int row, double from, double to) {
        double m = Double.NEGATIVE_INFINITY;
        for (int i = 0; i < rec[0].length; i++) {
            if (rec[0][i] >= from && rec[0][i] <= to) {
                m = Math.max(m, rec[row][i]);
            }
        }
        return m;
    }

    /** Smallest value of {@code row} for times in [from, to]. */
    public static double min(double[][] rec, int row, double from, double to) {
        double m = Double.POSITIVE_INFINITY;
        for (int i = 0; i < rec[0].length; i++) {
            if (rec[0][i] >= from && rec[0][i] <= to) {
                m = Math.min(m, rec[row][i]);
            }
        }
        return m;
    }

    /** Mean of {@code row} for times in [from, to]. */
    public static double mean(double[][] rec, int row, double from, double to) {
        double s = 0;
        int n = 0;
        for (int i = 0; i < rec[0].length; i++) {
            if (rec[0][i] >= from && rec[0][i] <= to) {
                s += rec[row][i];
                n++;
            }
        }
        return s / n;
    }

    /** First time at or after {@code from} when {@code row} crosses {@code level} (in the direction from its value at {@code from}). */
    public static double crossing(double[][] rec, int row, double from, double level) {
        int i0 = 0;
        while (i0 < rec[0].length && rec[0][i0] < from) {
            i0++;
        }
        final boolean rising = rec[row][i0] < level;
        for (int i = i0; i < rec[0].length; i++) {
            if (rising ? rec[row][i] >= level : rec[row][i] <= level) {
                if (i == i0) {
                    return rec[0][i];
                }
                // linear interpolation between samples
                final double a = rec[row][i - 1];
                final double b = rec[row][i];
                return rec[0][i - 1] + (level - a) / (b - a) * (rec[0][i] - rec[0][i - 1]);
            }
        }
        return Double.NaN;
    }

    /** Plant signal by its SIGNALS.md name (value after the last step). */
    public double signal(String name) {
        final Integer i = index.get(name);
        if (i == null) {
            throw new IllegalArgumentException("no plant signal " + name);
        }
        return signals[i];
    }

    public int signalIndex(String name) {
        return index.get(name);
    }

    public double signal(int i) {
        return signals[i];
    }

    public double timeS() {
        return plant.plantTimeNs() * 1e-9;
    }
}
