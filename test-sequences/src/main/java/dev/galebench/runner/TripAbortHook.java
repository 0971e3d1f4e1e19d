package dev.galebench.runner;

import dev.galebench.plant.PlantModel;
import dev.galebench.plant.SensorView;
import dev.galebench.rt.RealTimeLoop;
import dev.galebench.rt.StepHook;

/**
 * The run's step hook: applies the compiled schedule, then aborts the loop at the first plant
 * step with a latched hardware trip the sequence did not allow ({@code allow_trips}). Real-time
 * safe: a mask test per step and, once, {@link RealTimeLoop#abort(String)} with a constant
 * reason (two volatile writes). The trip bits are read from the result after the run.
 */
final class TripAbortHook implements StepHook {
    /** Reason given to the loop; the runner replaces it with the trip names after the run. */
    static final String REASON = "hardware trip";
    private final StepHook schedule;
    private final int allowedMask;
    private RealTimeLoop loop;
    private volatile int tripSeen;
    private volatile long tripStep = -1;

    TripAbortHook(StepHook schedule, int allowedMask) {
        this.schedule = schedule;
        this.allowedMask = allowedMask;
    }

    /** Set once the loop is built (before it runs). */
    void attach(RealTimeLoop loop) {
        this.loop = loop;
    }

    @Override
    public void beforeStep(long stepIndex, PlantModel plant) {
        schedule.beforeStep(stepIndex, plant);
        if (tripStep < 0) {
            final int trips = plant.tripFlags() & SensorView.TRIP_MASK & ~allowedMask;
            if (trips != 0) {
                tripSeen = trips;
                tripStep = stepIndex;
                if (loop != null) {
                    loop.abort(REASON);
                }
            }
        }
    }

    /** Trip bits that caused the abort (0 if none). */
    int tripSeen() {
        return tripSeen;
    }

    /** Step at which it was seen (-1 if none). */
    long tripStep() {
        return tripStep;
    }

    /** Names of trip bits, e.g. "DC overvoltage, link watchdog". */
    static String names(int flags) {
        StringBuilder b = new StringBuilder();
        String[] n = {"DC overvoltage", "MSC overcurrent", "GSC overcurrent", "link watchdog", "overspeed"};
        for (int i = 0; i < n.length; i++) {
            if ((flags & (1 << (8 + i))) != 0) {
                b.append(b.length() == 0 ? "" : ", ").append(n[i]);
            }
        }
        if ((flags & SensorView.TRIP_MASK & ~0x1F00) != 0) {
            b.append(b.length() == 0 ? "" : ", ").append("bits 0x").append(Integer.toHexString(flags & 0xE000));
        }
        return b.toString();
    }
}
