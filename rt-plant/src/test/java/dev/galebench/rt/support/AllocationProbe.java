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
    private final long[] readings = {-1, -1};
    private final long firstStep;
    private final long secondStep;

    public AllocationProbe(long firstStep, long secondStep) {
        this.firstStep = firstStep;
        this.secondStep = secondStep;
        mx.getCurrentThreadAllocatedBytes();
    }

    @Override
    public void beforeStep(long stepIndex, PlantModel plant) {
        if (stepIndex == firstStep) {
            readings[0] = mx.getCurrentThreadAllocatedBytes();
        } else if (stepIndex == secondStep) {
            readings[1] = mx.getCurrentThreadAllocatedBytes();
        }
    }

    /** Bytes allocated between the two steps; throws if either step was never reached. */
    public long allocatedBytes() {
        if (readings[0] < 0 || readings[1] < 0) {
            throw new IllegalStateException("the loop did not reach steps " + firstStep + " and " + secondStep);
        }
        return readings[1] - readings[0];
    }
}
