package dev.galebench.sequence;

/**
 * Where a compiled schedule switches link faults on and off. The runner adapts it to the
 * link's fault-injection settings. Called on the real-time thread at exact steps: an
 * implementation must only write primitive fields (no allocation, no lock, no log).
 */
public interface LinkFaultControl {
    /**
     * Starts fault {@code kind} with per-reply probability {@code rate} (1 for
     * {@link LinkFaultKind#SILENCE}); {@code delayExchanges} applies to {@link LinkFaultKind#DELAY}.
     */
    void begin(LinkFaultKind kind, double rate, int delayExchanges);

    /** Ends the fault that is active. */
    void end();
}
