package dev.galebench.check;

import dev.galebench.rt.LinkCounters;

/**
 * What the runner knows about a finished run beyond the sample stream: whether it ran against
 * the clock, the loop's timing summary (from its HdrHistogram recorders, every tick) and the
 * link's counters. Timing and link-health checks are judged from these after the run.
 * Plain fields, filled once by the runner.
 */
public final class RunFacts {
    /** True if the loop ran against the clock (a board); false for offline runs. */
    public boolean realTime;
    /** True if the run stopped before its duration (trip, error). */
    public boolean aborted;
    /** Why it stopped early, or null. */
    public String abortReason;
    /** Exchanges done. */
    public long exchanges;
    /** Ticks later than one period (the loop's definition). */
    public long overruns;
    /** Tick lateness percentiles and maximum, us (NaN if not measured). */
    public double latenessP50Us = Double.NaN, latenessP99Us = Double.NaN, latenessP999Us = Double.NaN,
            latenessMaxUs = Double.NaN;
    /** Round trip to the board, us (NaN if not measured). */
    public double roundTripP50Us = Double.NaN, roundTripP99Us = Double.NaN, roundTripP999Us = Double.NaN,
            roundTripMaxUs = Double.NaN;
    /** The link's counters at the end of the run. */
    public final LinkCounters link = new LinkCounters();
}
