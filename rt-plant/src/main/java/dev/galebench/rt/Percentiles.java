package dev.galebench.rt;

import org.HdrHistogram.Histogram;

/**
 * Summary of one timing histogram, in the histogram's unit (ns for times, exchanges for the
 * reply age). {@code count} 0 means nothing was recorded and every percentile is 0.
 */
public record Percentiles(long count, long p50, long p99, long p999, long p9999, long max, double mean) {
    /** Summarises {@code h} (reader side; allocates). */
    public static Percentiles of(Histogram h) {
        if (h.getTotalCount() == 0) {
            return new Percentiles(0, 0, 0, 0, 0, 0, 0.0);
        }
        return new Percentiles(h.getTotalCount(),
                h.getValueAtPercentile(50.0), h.getValueAtPercentile(99.0),
                h.getValueAtPercentile(99.9), h.getValueAtPercentile(99.99),
                h.getMaxValue(), h.getMean());
    }

    /** Same summary with every value divided by 1000 (ns to us), as doubles. */
    public double[] micros() {
        return new double[] {p50 / 1e3, p99 / 1e3, p999 / 1e3, p9999 / 1e3, max / 1e3};
    }
}
