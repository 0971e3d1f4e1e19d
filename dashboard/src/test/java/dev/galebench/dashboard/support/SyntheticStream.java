package dev.galebench.dashboard.support;

import dev.galebench.rt.Sample;
import dev.galebench.rt.SampleConsumer;

/**
 * Drives a {@link SampleConsumer} with a known signal layout and values computed from the
 * exchange index, from the calling thread (as a ring's consumer thread would).
 * Layout: {@code v_dc_v} (V), {@code wind_m_s} (m/s), {@code lateness_us} (us),
 * {@code rtt_us} (us), {@code not_plotted} (1).
 */
public final class SyntheticStream {
    public static final String[] NAMES = {"v_dc_v", "wind_m_s", "lateness_us", "rtt_us", "not_plotted"};
    public static final String[] UNITS = {"V", "m/s", "us", "us", "1"};

    /** What each exchange carries; {@code k} is the exchange index. */
    @FunctionalInterface
    public interface Values {
        void fill(long k, double[] v);
    }

    private final SampleConsumer consumer;
    private final long exchangePeriodNs;
    private final Sample sample = new Sample(NAMES.length);
    private long k;

    public SyntheticStream(SampleConsumer consumer, long exchangePeriodNs) {
        this.consumer = consumer;
        this.exchangePeriodNs = exchangePeriodNs;
    }

    public void start() {
        consumer.onStart(NAMES.clone(), UNITS.clone(), exchangePeriodNs, 1);
    }

    /** Publishes {@code count} exchanges. */
    public void run(long count, Values values) {
        for (long i = 0; i < count; i++, k++) {
            sample.exchangeIndex = k;
            sample.stepIndex = k;
            sample.plantTimeNs = k * exchangePeriodNs;
            values.fill(k, sample.values);
            consumer.onSample(sample);
        }
    }

    /** Publishes {@code count} exchanges paced to plant time (real-time run), sleeping between buckets. */
    public void runPaced(long count, Values values) throws InterruptedException {
        long t0 = System.nanoTime();
        long first = k;
        for (long i = 0; i < count; i++) {
            run(1, values);
            long due = t0 + (k - first) * exchangePeriodNs;
            long wait = due - System.nanoTime();
            if (wait > 2_000_000L) {
                Thread.sleep(wait / 1_000_000L);
            }
        }
    }

    public void end(long missed) {
        consumer.onEnd(missed);
    }

    public long exchanges() {
        return k;
    }
}
