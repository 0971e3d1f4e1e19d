package dev.galebench.rt.support;

import dev.galebench.plant.PlantModel;
import dev.galebench.rt.StepHook;

import java.lang.management.ManagementFactory;

/**
 * A step hook that reads the loop thread's own allocated-bytes counter
 * ({@code com.sun.management.ThreadMXBean#getCurrentThreadAllocatedBytes}) before two given
 * steps; the difference is what the loop thread allocated in between. Allocation-free itself.
 */
public final class AllocationProbe implements StepHook {
    private final com.sun.management.ThreadMXBean mx =
            (com.sun.management.ThreadMXBean) ManagementFactory.getThreadMXBean();
    private final long[] readings;
    private final long firstStep;
    private final long windowSteps;

    /** One window, from {@code firstStep} to {@code secondStep}. */
    public AllocationProbe(long firstStep, long secondStep) {
        this(firstStep, secondStep - firstStep, 1);
    }

    /**
     * {@code windows} back-to-back windows of {@code windowSteps} from {@code firstStep}: an
     * allocation on the loop's path shows in every window, a one-off charge of the JVM to the
     * thread (a deoptimisation, a class initialised late) in one only.
     */
    public AllocationProbe(long firstStep, long windowSteps, int windows) {
        this.firstStep = firstStep;
        this.windowSteps = windowSteps;
        this.readings = new long[windows + 1];
        java.util.Arrays.fill(readings, -1);
        mx.getCurrentThreadAllocatedBytes();
    }

    /** The step the last window ends at (run the loop past it). */
    public long lastStep() {
        return firstStep + windowSteps * (readings.length - 1);
    }

    @Override
    public void beforeStep(long stepIndex, PlantModel plant) {
        final long offset = stepIndex - firstStep;
        if (offset >= 0 && offset % windowSteps == 0 && offset / windowSteps < readings.length) {
            readings[(int) (offset / windowSteps)] = mx.getCurrentThreadAllocatedBytes();
        }
    }

    /** Bytes allocated in the first window; throws if a window's end was never reached. */
    public long allocatedBytes() {
        check();
        return readings[1] - readings[0];
    }

    /** The fewest bytes allocated in any one window. */
    public long fewestBytesInAWindow() {
        check();
        long min = Long.MAX_VALUE;
        for (int i = 1; i < readings.length; i++) {
            min = Math.min(min, readings[i] - readings[i - 1]);
        }
        return min;
    }

    private void check() {
        for (long r : readings) {
            if (r < 0) {
                throw new IllegalStateException("the loop did not reach step " + lastStep());
            }
        }
    }
}
