package dev.galebench.dashboard;

import java.util.List;

/**
 * What the console may ask of the bench. Implemented by the command that owns the bench
 * ({@code galebench serve}, or {@code run}/{@code demo} with {@code --dashboard}); the console
 * never reaches into the runner or the loop itself, so this module depends on rt-plant only.
 *
 * <p>Threading: every method is called from the console's single control thread, never from
 * a network thread and never from the real-time thread. A method should return quickly (start
 * the work, don't wait for it): the next request queues behind it. Actions that reach the plant
 * must go through the run's compiled schedule or another real-time-safe hand-off, and every
 * accepted control must be written to the run's own log by the implementation (the console
 * also keeps its own control log, which is not the run's record).
 *
 * <p>Refusals are answers, not exceptions: return {@link ControlResult#refused(String)} with a
 * reason a user understands ("no run in progress", "bench is not interactive").
 */
public interface BenchControl {
    /** Sequences the bench can start, in the order to list them. */
    List<SequenceInfo> sequences();

    /**
     * True if bench controls (wind, dip/swell, voltage-deviation reference, link fault) are
     * available; false for a scripted run, where only watching (and abort) makes sense.
     */
    boolean interactive();

    /** Names of the link faults {@link #injectLinkFault} accepts (empty if none). */
    List<String> linkFaults();

    /** Starts the named sequence; refused while another one runs. */
    ControlResult startSequence(String name);

    /** Aborts the sequence in progress. */
    ControlResult abort();

    /** Sets the hub wind speed, m/s, from the next plant step on. */
    ControlResult setWind(double windMPerS);

    /**
     * Applies a symmetric grid voltage event: the source magnitude goes to {@code levelPu}
     * (below 1 = dip, above 1 = swell) for {@code durationS}, then returns to its value before.
     */
    ControlResult voltageEvent(double levelPu, double durationS);

    /** Steps the plant-level voltage-deviation reference to {@code referencePu}. */
    ControlResult stepVoltageDeviationReference(double referencePu);

    /** Injects the named link fault (one of {@link #linkFaults()}) for {@code durationS}. */
    ControlResult injectLinkFault(String fault, double durationS);
}
