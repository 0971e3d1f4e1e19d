package dev.galebench.rt;

import org.HdrHistogram.Histogram;

/**
 * The machine's busy-spin timing floor: a thread that does nothing but spin to the deadlines
 * t0 + k h, measured the same way the {@link RealTimeLoop} measures itself (lateness of each
 * tick against its absolute deadline, catch-up after a miss). Whatever lateness this shows
 * belongs to the machine (host steals, kernel tick, other processes), not to galebench; the
 * preflight command judges the loop as ratios to a floor taken in the same run.
 *
 * <p>Counts: {@code stalls} are ticks that started more than one step after their deadline, by
 * exactly the rule the loop uses for its overruns, so the two compare like with like;
 * {@code clockGaps} are the episodes behind them (two consecutive clock reads more than one step
 * apart: one 5 ms steal at 50 us is one gap and about 100 stalls).
 *
 * <p>With a {@link FloorIo} the floor also does the bare input/output of an exchange each tick
 * (send one frame right after the deadline, poll for replies while spinning, exactly where
 * the loop does), with no plant, controller or codec: the "I/O floor". On a virtual machine,
 * waking a peer on another core for every frame costs the spinning core stalls of its own
 * (inter-processor interrupts go through the hypervisor); the I/O floor shows how much of the
 * loop's lateness that alone explains.
 *
 * <p>Spins one core at 100 % for the whole duration.
 */
public final class SpinFloor {
    /** The bare input/output an I/O floor does per tick. Implementations must not allocate. */
    public interface FloorIo {
        /** Right after tick {@code k}'s deadline was met (or missed): send one frame. */
        void onTick(long k);

        /** While spinning toward a deadline more than the loop's poll guard (3 us) away: read what arrived. */
        void poll();
    }

    /** What one floor run measured; lateness in ns. */
    public record Result(long stepPeriodNs, long ticks, long stalls, long clockGaps, long maxClockGapNs,
                         Histogram latenessNs, String pinning) {
    }

    private SpinFloor() {
    }

    /**
     * Spins for {@code durationNs} on a fresh thread "galebench-floor" (pinned to {@code pinCpu}
     * if &ge; 0) and returns what it saw. Blocks the caller.
     */
    public static Result measure(long stepPeriodNs, long durationNs, int pinCpu) throws InterruptedException {
        return measure(stepPeriodNs, durationNs, pinCpu, null);
    }

    /** Same, doing {@code io} every tick (null: nothing, the pure floor). */
    public static Result measure(long stepPeriodNs, long durationNs, int pinCpu, FloorIo io) throws InterruptedException {
        if (stepPeriodNs < 1_000 || durationNs < stepPeriodNs) {
            throw new IllegalArgumentException("spin floor: step " + stepPeriodNs + " ns / duration " + durationNs + " ns out of range");
        }
        final Histogram h = new Histogram(1, LoopTimings.HIGHEST_TIME_NS, TimingChannel.SIGNIFICANT_DIGITS);
        final long[] out = new long[4];
        final String[] pin = {"not requested"};
        final Thread t = new Thread(() -> {
            if (pinCpu >= 0) {
                pin[0] = CpuPinning.pinCurrentThread(pinCpu);
            }
            spin(stepPeriodNs, durationNs / stepPeriodNs, h, out, io);
        }, "galebench-floor");
        t.setPriority(Thread.MAX_PRIORITY);
        final CpuPinning.Isolation isolation = pinCpu >= 0 ? CpuPinning.isolate(pinCpu) : null;
        try {
            t.start();
            t.join();
        } finally {
            if (isolation != null) {
                isolation.restore();
                pin[0] = pin[0] + "; " + isolation.outcome();
            }
        }
        return new Result(stepPeriodNs, out[0], out[1], out[2], out[3], h, pin[0]);
    }

    private static void spin(long period, long ticks, Histogram h, long[] out, FloorIo io) {
        final long guard = RealTimeLoop.POLL_GUARD_NS;
        final long highest = LoopTimings.HIGHEST_TIME_NS;
        long stalls = 0;
        long gaps = 0;
        long maxGap = 0;
        final long t0 = System.nanoTime() + period;
        long last = System.nanoTime();
        for (long k = 0; k < ticks; k++) {
            final long deadline = t0 + k * period;
            long now = System.nanoTime();
            while (now < deadline) {
                final long gap = now - last;
                if (gap > period) {
                    gaps++;
                }
                if (gap > maxGap) {
                    maxGap = gap;
                }
                last = now;
                if (io != null && deadline - now > guard) {
                    io.poll();
                } else {
                    Thread.onSpinWait();
                }
                now = System.nanoTime();
            }
            final long gap = now - last;
            if (gap > period) {
                gaps++;
            }
            if (gap > maxGap) {
                maxGap = gap;
            }
            last = now;
            final long lateness = now - deadline;
            if (lateness > period) {
                stalls++;
            }
            h.recordValue(Math.min(lateness, highest));
            if (io != null) {
                io.onTick(k);
            }
        }
        out[0] = ticks;
        out[1] = stalls;
        out[2] = gaps;
        out[3] = maxGap;
    }
}
