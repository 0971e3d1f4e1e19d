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

    /** Something to measure that may throw (a loop that joins a thread, say). */
    public interface Body {
        void run() throws Exception;
    }

    /**
     * The fewest bytes the calling thread allocated in any of {@code windows} runs of
     * {@code body}. An allocation on the path under test shows in every window (a million
     * iterations of even one 16-byte object is 16 MB); a one-off charge of the JVM to this thread
     * (a deoptimisation or on-stack replacement, a class initialised on a rare branch: a few
     * hundred bytes seen now and then on a loaded machine) shows in one window only. So "the
     * steady state allocates nothing" is: the minimum over a few windows is zero.
     */
    public static long minOverWindows(int windows, Body body) throws Exception {
        long min = Long.MAX_VALUE;
        for (int w = 0; w < windows && min != 0; w++) {
            final long before = threadAllocatedBytes();
            body.run();
            min = Math.min(min, threadAllocatedBytes() - before);
        }
        return min;
    }
}
