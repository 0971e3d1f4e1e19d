package dev.galebench.check;

/**
 * A condition on one signal that an event check waits for: above or below a threshold, or a
 * bit mask set or clear in a flags signal (e.g. {@code frt_active} above 0.5, {@code trip_flags}
 * with bit 11 set).
 */
public final class Condition {
    /** How the signal is compared. */
    public enum Kind { ABOVE, BELOW, BITS_SET, BITS_CLEAR }

    private final String signal;
    private final Kind kind;
    private final double threshold;
    private int slot;

    public Condition(String signal, Kind kind, double threshold) {
        this.signal = signal;
        this.kind = kind;
        this.threshold = threshold;
    }

    /** A fresh, unbound copy (conditions keep their slot, so each run needs its own). */
    public Condition copy() {
        return new Condition(signal, kind, threshold);
    }

    public String signal() {
        return signal;
    }

    void bind(SignalIndex index) {
        slot = index.of(signal);
    }

    boolean holds(double[] values) {
        final double v = values[slot];
        switch (kind) {
            case ABOVE:
                return v > threshold;
            case BELOW:
                return v < threshold;
            case BITS_SET: {
                final long mask = (long) threshold;
                return ((long) v & mask) == mask;
            }
            default:
                return ((long) v & (long) threshold) == 0;
        }
    }

    double value(double[] values) {
        return values[slot];
    }

    /** E.g. {@code frt_active > 0.5}, {@code trip_flags has bits 0x800}. */
    public String describe() {
        switch (kind) {
            case ABOVE:
                return signal + " > " + Fmt.number(threshold);
            case BELOW:
                return signal + " < " + Fmt.number(threshold);
            case BITS_SET:
                return signal + " has bits 0x" + Long.toHexString((long) threshold) + " set";
            default:
                return signal + " has bits 0x" + Long.toHexString((long) threshold) + " clear";
        }
    }
}
