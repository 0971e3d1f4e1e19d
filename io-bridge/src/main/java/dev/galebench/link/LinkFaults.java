package dev.galebench.link;

/**
 * Deterministic fault injection on the reply path of a link (board to plant): drop, delay by
 * N exchanges, duplicate, corrupt one byte, each by rate, plus "silence" (every reply
 * dropped) for watchdog tests. Injected before the CRC check, so a corrupted reply is
 * counted by the link exactly like a real line error.
 *
 * <p>Plain fields, no locks: the real-time thread (for example a sequence action at an exact
 * step) changes them between exchanges and the link reads them on its next {@code poll}.
 * Same seed and same rates give the same faults on the same reply stream. Allocation-free.
 *
 * <table>
 *   <caption>Settings</caption>
 *   <tr><th>field</th><th>unit</th><th>range</th><th>effect on each reply</th></tr>
 *   <tr><td>dropRate</td><td>1</td><td>0..1</td><td>probability the reply is lost</td></tr>
 *   <tr><td>delayRate</td><td>1</td><td>0..1</td><td>probability the reply is held back by {@code delayExchanges}</td></tr>
 *   <tr><td>delayExchanges</td><td>exchanges</td><td>0..1000</td><td>how many further sends pass before a delayed reply is delivered</td></tr>
 *   <tr><td>duplicateRate</td><td>1</td><td>0..1</td><td>probability the reply is delivered twice</td></tr>
 *   <tr><td>corruptRate</td><td>1</td><td>0..1</td><td>probability one random byte of the reply is changed</td></tr>
 *   <tr><td>truncateRate</td><td>1</td><td>0..1</td><td>probability the reply loses 1 to length/2 bytes at its end (a line that ate bytes), never down to another valid frame length</td></tr>
 *   <tr><td>silent</td><td>flag</td><td></td><td>every reply is dropped (the board "falls silent")</td></tr>
 * </table>
 *
 * <p>The counters ({@code injectedDrops} ...) say what was done, so a test can account for
 * every reply.
 */
public final class LinkFaults {
    public double dropRate;
    public double delayRate;
    public int delayExchanges;
    public double duplicateRate;
    public double corruptRate;
    public double truncateRate;
    public boolean silent;

    /** Replies dropped by {@link #dropRate}. */
    public long injectedDrops;
    /** Replies dropped because {@link #silent} was set. */
    public long silencedReplies;
    /** Replies held back by {@link #delayRate}. */
    public long injectedDelays;
    /** Extra copies delivered by {@link #duplicateRate}. */
    public long injectedDuplicates;
    /** Replies with one byte changed by {@link #corruptRate}. */
    public long injectedCorruptions;
    /** Replies shortened by {@link #truncateRate}. */
    public long injectedTruncations;
    /** Replies lost because the delay line was full (should stay 0; it holds 64 frames). */
    public long delayLineOverflows;

    private long state;

    /** No faults, seed 1. */
    public LinkFaults() {
        reseed(1L);
    }

    /** Restarts the pseudo-random sequence (xorshift64*) from {@code seed}. */
    public LinkFaults reseed(long seed) {
        state = seed == 0 ? 0x9E3779B97F4A7C15L : seed;
        return this;
    }

    /** True if any fault is configured; the link takes its plain path otherwise. */
    public boolean active() {
        return silent || dropRate > 0 || delayRate > 0 || duplicateRate > 0 || corruptRate > 0 || truncateRate > 0;
    }

    /** Turns every fault off (rates 0, not silent); counters and seed are kept. */
    public void clear() {
        dropRate = delayRate = duplicateRate = corruptRate = truncateRate = 0;
        delayExchanges = 0;
        silent = false;
    }

    /** Uniform in [0, 1). */
    double nextDouble() {
        return (nextLong() >>> 11) * 0x1.0p-53;
    }

    long nextLong() {
        long x = state;
        x ^= x >>> 12;
        x ^= x << 25;
        x ^= x >>> 27;
        state = x;
        return x * 0x2545F4914F6CDD1DL;
    }
}
