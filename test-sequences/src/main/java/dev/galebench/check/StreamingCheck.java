package dev.galebench.check;

import dev.galebench.report.CheckOutcome;

/**
 * One check of a sequence as a small state machine over the sample stream. It keeps a few
 * primitives (extremes, first/last crossing times, running sums), never the samples, so memory
 * stays flat however long the run is. Lifecycle: {@link #bind} once with the run's layout
 * (unknown signals are refused there, before the run starts), {@link #onSample} for every
 * sample in time order on the checker's thread, {@link #finish} once after the run.
 *
 * <p>Times inside checks are seconds of plant time; a sample's time is the end of its exchange.
 */
public abstract class StreamingCheck {
    private final String name;
    private final String kind;

    protected StreamingCheck(String name, String kind) {
        this.name = name;
        this.kind = kind;
    }

    public final String name() {
        return name;
    }

    public final String kind() {
        return kind;
    }

    /** Names of the signals this check reads (for validation before the run). */
    public abstract String[] signals();

    /** Resolves signal slots. @throws IllegalArgumentException for an unknown signal */
    public abstract void bind(SignalIndex index);

    /** One sample: plant time in s and the values in layout order (reused after the call). */
    public abstract void onSample(double timeS, double[] values);

    /** The verdict, after the last sample. */
    public abstract CheckOutcome finish(RunFacts facts);

    protected final CheckOutcome outcome(boolean passed, String measured, String required, String message,
                                         String signal, double fromS, double toS, double low, double high) {
        return new CheckOutcome(name, kind, passed, measured, required, message, signal, fromS, toS, low, high);
    }
}
