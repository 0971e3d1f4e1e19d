package dev.galebench.check;

/**
 * A check that judges one signal: holds its name, and after {@link #bind} its slot in the
 * sample and its unit, so the kinds that read one signal share the binding instead of
 * repeating it.
 */
public abstract class SingleSignalCheck extends StreamingCheck {
    /** The judged signal's name. */
    protected final String signal;
    /** Index of {@link #signal} in each sample's values (valid after {@link #bind}). */
    protected int slot;
    /** Unit of {@link #signal} (valid after {@link #bind}). */
    protected String unit;

    protected SingleSignalCheck(String name, String kind, String signal) {
        super(name, kind);
        this.signal = signal;
    }

    @Override
    public final String[] signals() {
        return new String[] {signal};
    }

    @Override
    public final void bind(SignalIndex index) {
        slot = index.of(signal);
        unit = index.unit(slot);
    }
}
