package dev.galebench.testsupport;

import java.lang.management.ManagementFactory;

/** Bytes allocated by the current thread ({@code com.sun.management.ThreadMXBean}). */
public final class Allocations {
    private static final com.sun.management.ThreadMXBean BEAN =
            (com.sun.management.ThreadMXBean) ManagementFactory.getThreadMXBean();

    private Allocations() {
    }

    public static long threadAllocatedBytes() {
        return BEAN.getThreadAllocatedBytes(Thread.currentThread().getId());
    }
}
