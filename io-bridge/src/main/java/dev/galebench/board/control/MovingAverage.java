package dev.galebench.board.control;

/**
 * Moving average over a fixed window (a ring buffer and a running sum). Over half a grid period
 * it removes a component at twice the grid frequency, and any even harmonic, completely: used on
 * the negative-sequence voltage in its own frame, where the transient of the sequence
 * separation after a balanced step shows up at 2f while a real negative sequence is constant.
 * The buffer is allocated in {@link #configure}, never in {@link #step}.
 */
public final class MovingAverage {
    private double[] buffer = new double[1];
    private int next;
    private double sum;

    /** Window {@code windowS} at sample period {@code samplePeriodS} (at least one sample). Allocates. */
    public void configure(double windowS, double samplePeriodS) {
        final int n = Math.max(1, (int) Math.round(windowS / samplePeriodS));
        if (n != buffer.length) {
            buffer = new double[n];
        }
        reset(0.0);
    }

    /** Fills the window with {@code value}. */
    public void reset(double value) {
        java.util.Arrays.fill(buffer, value);
        sum = value * buffer.length;
        next = 0;
    }

    /** One sample; returns the mean over the window. */
    public double step(double x) {
        sum += x - buffer[next];
        buffer[next] = x;
        next = next + 1 == buffer.length ? 0 : next + 1;
        return sum / buffer.length;
    }

    public double value() {
        return sum / buffer.length;
    }
}
