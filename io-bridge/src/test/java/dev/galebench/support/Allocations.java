package dev.galebench.support;

import java.lang.management.ManagementFactory;

/**
 * Bytes allocated by the current thread, from {@code com.sun.management.ThreadMXBean}. The
 * allocation-free tests warm up, read this, run about a million iterations, read it again.
 */
public final class Allocations {
    private static final com.sun.management.ThreadMXBean BEAN =
            (com.sun.management.ThreadMXBean) ManagementFactory.getThreadMXBean();

    private Allocations() {
    }

    /** Bytes the calling thread has allocated so far. */
    public static long currentThreadAllocatedBytes() {
        return BEAN.getThreadAllocatedBytes(Thread.currentThread().getId());
    }

    /** Runs {@code body} and returns the bytes the calling thread allocated meanwhile. */
    public static long measure(Runnable body) {
        final long before = currentThreadAllocatedBytes();
        body.run();
        // the second reading itself allocates nothing; subtracting 0 keeps the formula honest
        return currentThreadAllocatedBytes() - before;
    }

    /**
     * The fewest bytes the calling thread allocated in any of {@code windows} runs of
     * {@code body}. An allocation on the path under test shows in every window (a million
     * iterations of even one 16-byte object is 16 MB); a one-off charge of the JVM to this thread
     * (a deoptimisation or on-stack replacement of the measured loop, a class initialised on a
     * rare branch: a few hundred bytes seen now and then on a loaded machine) shows in one window
     * only. So "steady state allocates nothing" is: the minimum over three windows is zero.
     */
    public static long minOverWindows(int windows, Runnable body) {
        long min = Long.MAX_VALUE;
        for (int w = 0; w < windows && min != 0; w++) {
            min = Math.min(min, measure(body));
        }
        return min;
    }
}
