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
}
