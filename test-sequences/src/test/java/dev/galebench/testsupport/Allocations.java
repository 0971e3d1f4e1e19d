package dev.galebench.testsupport;

import java.lang.management.ManagementFactory;

/** Bytes allocated by the current thread ({@code com.sun.management.ThreadMXBean}). */
public final class Allocations {
    private static final com.sun.management.ThreadMXBean BEAN =
            (com.sun.management.ThreadMXBean) ManagementFactory.getThreadMXBean();

    private Allocations() {
    }

    static {
        // the first calls allocate inside the management bean; warm it up once
        for (int i = 0; i < 1000; i++) {
            BEAN.getThreadAllocatedBytes(Thread.currentThread().getId());
        }
    }

    public static long threadAllocatedBytes() {
        return BEAN.getThreadAllocatedBytes(Thread.currentThread().getId());
    }
}
