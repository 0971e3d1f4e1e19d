package dev.galebench.rt;

/**
 * One slot of the sample ring: everything recorded about one exchange. Slots are allocated
 * once when the ring is built ({@code values} sized to the run's signal layout) and
 * overwritten in place by the real-time thread; consumers must copy what they keep.
 */
public final class Sample {
    /** Exchange counter, 0-based. */
    public long exchangeIndex;
    /** Plant step index at the end of this exchange. */
    public long stepIndex;
    /** Plant time at the end of this exchange, ns. */
    public long plantTimeNs;
    /** Signal values in the order of the run's signal names (see {@link SampleConsumer#onStart}). */
    public final double[] values;

    public Sample(int signalCount) {
        this.values = new double[signalCount];
    }
}
