package dev.galebench.dashboard;

import dev.galebench.rt.LinkCounters;

/**
 * Counters a {@link TimingSource} fills; one instance is reused by the feed. (Not the loop's
 * own {@link dev.galebench.rt.TimingSnapshot}: this is only what the console shows beside the
 * timing it derives from the sample stream.)
 *
 * <table>
 *   <caption>Fields</caption>
 *   <tr><th>field</th><th>unit</th><th>meaning</th></tr>
 *   <tr><td>exchanges</td><td>1</td><td>exchanges done in this run</td></tr>
 *   <tr><td>overruns</td><td>1</td><td>ticks whose work ran past the next deadline</td></tr>
 *   <tr><td>samplesDropped</td><td>1</td><td>samples the ring lost for any consumer; -1 = not known</td></tr>
 *   <tr><td>link</td><td>-</td><td>link fault counters ({@link #linkPresent} false: no board link)</td></tr>
 * </table>
 */
public final class BenchCounters {
    public long exchanges;
    public long overruns;
    public long samplesDropped;
    public boolean linkPresent;
    public final LinkCounters link = new LinkCounters();

    /** Back to zeros before a source fills it. */
    public void clear() {
        exchanges = overruns = 0;
        samplesDropped = -1;
        linkPresent = false;
        link.reset();
    }
}
