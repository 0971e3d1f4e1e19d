package dev.galebench.sequence;

/**
 * One programmable plant input as a piecewise-linear function of the step index, compiled
 * before the run. Segment {@code i} runs from step {@code start[i]} (inclusive) to
 * {@code end[i]} (exclusive), linear from {@code from[i]} to {@code to[i]}; after it the value
 * holds at {@code to[i]} until the next segment starts. A segment with {@code start == end} is a
 * step change. Before the first segment the value is {@code initial}.
 *
 * <p>{@link #value} is called on the real-time thread once per step with increasing step
 * indices: it advances a cursor (amortised O(1)), allocates nothing and never throws.
 */
final class Track {
    private final double initial;
    private long[] start = new long[4], end = new long[4];
    private double[] from = new double[4], to = new double[4];
    private int n;
    private int cursor = -1;
    private double current;

    Track(double initial) {
        this.initial = initial;
        this.current = initial;
    }

    /** Value after all segments added so far (compile time). */
    double current() {
        return current;
    }

    double initial() {
        return initial;
    }

    int segments() {
        return n;
    }

    /** Appends a segment; segments must be added in time order without overlap. */
    void add(long startStep, long endStep, double fromValue, double toValue) {
        if (n > 0 && startStep < end[n - 1]) {
            throw new IllegalStateException("segments out of order");
        }
        if (n == start.length) {
            start = java.util.Arrays.copyOf(start, 2 * n);
            end = java.util.Arrays.copyOf(end, 2 * n);
            from = java.util.Arrays.copyOf(from, 2 * n);
            to = java.util.Arrays.copyOf(to, 2 * n);
        }
        start[n] = startStep;
        end[n] = endStep;
        from[n] = fromValue;
        to[n] = toValue;
        n++;
        current = toValue;
    }

    /** Rewinds the cursor (before a new run over the same schedule). */
    void rewind() {
        cursor = -1;
    }

    /** Value at {@code step}. Real-time safe. */
    double value(long step) {
        int c = cursor;
        if (c >= 0 && step < start[c]) {
            c = -1;
        }
        while (c + 1 < n && start[c + 1] <= step) {
            c++;
        }
        cursor = c;
        if (c < 0) {
            return initial;
        }
        final long e = end[c];
        if (step < e) {
            final long s = start[c];
            return from[c] + (to[c] - from[c]) * (double) (step - s) / (double) (e - s);
        }
        return to[c];
    }
}
