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

    /**
     * The bench of a scripted run ({@code run}/{@code demo --dashboard}): lists the one sequence
     * being run, offers abort (which calls {@code abort}), refuses everything else.
     */
    static BenchControl watchOnly(String sequenceName, Runnable abort) {
        return new BenchControl() {
            private volatile boolean aborted;

            @Override
            public List<SequenceInfo> sequences() {
                return List.of(new SequenceInfo(sequenceName, "this run", Double.NaN));
            }

            @Override
            public boolean interactive() {
                return false;
            }

            @Override
            public List<String> linkFaults() {
                return List.of();
            }

            @Override
            public ControlResult startSequence(String name) {
                return ControlResult.refused("this is a scripted run; start sequences with galebench serve");
            }

            @Override
            public ControlResult abort() {
                if (aborted) {
                    return ControlResult.refused("abort already requested");
                }
                aborted = true;
                abort.run();
                return ControlResult.ok("abort requested");
            }

            @Override
            public ControlResult setWind(double windMPerS) {
                return ControlResult.refused("bench controls need galebench serve");
            }

            @Override
            public ControlResult voltageEvent(double levelPu, double durationS) {
                return ControlResult.refused("bench controls need galebench serve");
            }

            @Override
            public ControlResult stepVoltageDeviationReference(double referencePu) {
                return ControlResult.refused("bench controls need galebench serve");
            }

            @Override
            public ControlResult injectLinkFault(String fault, double durationS) {
                return ControlResult.refused("bench controls need galebench serve");
            }
        };
    }
}
