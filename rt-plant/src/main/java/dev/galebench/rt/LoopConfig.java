package dev.galebench.rt;

/**
 * Parameters of one run of the {@link RealTimeLoop}. Immutable; built with {@link #builder()},
 * which validates every field once so the real-time thread only sees checked primitives.
 *
 * <table>
 *   <caption>Parameters</caption>
 *   <tr><th>field</th><th>unit</th><th>default</th><th>meaning</th></tr>
 *   <tr><td>stepPeriodNs</td><td>ns</td><td>50 000</td><td>plant step h; must equal the plant's own step</td></tr>
 *   <tr><td>exchangeEverySteps</td><td>steps</td><td>1</td><td>M: one board exchange every M plant steps</td></tr>
 *   <tr><td>durationSteps</td><td>steps</td><td>Long.MAX_VALUE (until aborted)</td><td>run length, rounded up to a whole number of exchanges</td></tr>
 *   <tr><td>realTime</td><td>-</td><td>true</td><td>true: busy-spin to each deadline t0 + k M h; false: offline, no waiting</td></tr>
 *   <tr><td>watchdogNs</td><td>ns</td><td>20 000 000</td><td>schedule time without a valid reply after which the plant trips ({@code TRIP_LINK_WATCHDOG}) and the converters are blocked</td></tr>
 *   <tr><td>ringSize</td><td>samples</td><td>16 384</td><td>slots of each consumer's ring (power of two)</td></tr>
 *   <tr><td>pinCpu</td><td>CPU index</td><td>-1 (none)</td><td>pin the loop thread to this CPU and move the process's other threads off it for the run (Linux, via {@code taskset})</td></tr>
 *   <tr><td>stopOnTrip</td><td>-</td><td>false</td><td>end the run at the first exchange with a latched plant trip</td></tr>
 *   <tr><td>missedTickPolicy</td><td>-</td><td>CATCH_UP</td><td>see {@link MissedTickPolicy}</td></tr>
 *   <tr><td>offlineBackpressure</td><td>-</td><td>true</td><td>offline only: wait (spin) for a full consumer ring instead of dropping, so a regression run records every exchange; never in real time</td></tr>
 *   <tr><td>pitchRefMinRad, pitchRefMaxRad</td><td>rad</td><td>-0.1745, 1.5708 (-10 deg, 90 deg)</td><td>pitch references outside are rejected as invalid; set from the turbine's pitch limits</td></tr>
 *   <tr><td>replyWaitNs</td><td>ns</td><td>0 (strict)</td><td>real time only: at a deadline whose frame is still unanswered, keep polling up to this long for the reply before stepping the plant. 0 = strict real time (step with the last good command). &gt; 0 = paced exchange: a slow board pauses plant time instead of being stepped past (every wait past the deadline is an overrun, and the schedule is re-based as with SKIP). For software boards on shared PCs and for bring-up; see LOOP.md</td></tr>
 *   <tr><td>timingIntervalNs</td><td>ns</td><td>1 000 000 000</td><td>interval of the timing histograms in the interval log and live snapshots</td></tr>
 * </table>
 */
public final class LoopConfig {
    public final long stepPeriodNs;
    public final int exchangeEverySteps;
    public final long durationSteps;
    public final boolean realTime;
    public final long watchdogNs;
    public final int ringSize;
    public final int pinCpu;
    public final boolean stopOnTrip;
    public final MissedTickPolicy missedTickPolicy;
    public final boolean offlineBackpressure;
    public final double pitchRefMinRad;
    public final double pitchRefMaxRad;
    public final long timingIntervalNs;
    public final long replyWaitNs;

    private LoopConfig(Builder b) {
        stepPeriodNs = b.stepPeriodNs;
        exchangeEverySteps = b.exchangeEverySteps;
        durationSteps = b.durationSteps;
        realTime = b.realTime;
        watchdogNs = b.watchdogNs;
        ringSize = b.ringSize;
        pinCpu = b.pinCpu;
        stopOnTrip = b.stopOnTrip;
        missedTickPolicy = b.missedTickPolicy;
        offlineBackpressure = b.offlineBackpressure;
        pitchRefMinRad = b.pitchRefMinRad;
        pitchRefMaxRad = b.pitchRefMaxRad;
        timingIntervalNs = b.timingIntervalNs;
        replyWaitNs = b.replyWaitNs;
    }

    /** Time between two exchanges, M h, ns. */
    public long exchangePeriodNs() {
        return stepPeriodNs * exchangeEverySteps;
    }

    /** Number of exchanges the run takes if nothing stops it earlier (durationSteps rounded up). */
    public long plannedExchanges() {
        return durationSteps / exchangeEverySteps + (durationSteps % exchangeEverySteps == 0 ? 0 : 1);
    }

    /** Watchdog time in whole exchanges (rounded up, at least 1): the loop counts it on the schedule, not on the wall clock, so offline runs trip at the same step as real-time ones. */
    public long watchdogExchanges() {
        final long p = exchangePeriodNs();
        return Math.max(1, (watchdogNs + p - 1) / p);
    }

    public static Builder builder() {
        return new Builder();
    }

    /** A builder starting from this configuration. */
    public Builder toBuilder() {
        Builder b = new Builder();
        b.stepPeriodNs = stepPeriodNs;
        b.exchangeEverySteps = exchangeEverySteps;
        b.durationSteps = durationSteps;
        b.realTime = realTime;
        b.watchdogNs = watchdogNs;
        b.ringSize = ringSize;
        b.pinCpu = pinCpu;
        b.stopOnTrip = stopOnTrip;
        b.missedTickPolicy = missedTickPolicy;
        b.offlineBackpressure = offlineBackpressure;
        b.pitchRefMinRad = pitchRefMinRad;
        b.pitchRefMaxRad = pitchRefMaxRad;
        b.timingIntervalNs = timingIntervalNs;
        b.replyWaitNs = replyWaitNs;
        return b;
    }

    @Override
    public String toString() {
        return "LoopConfig{stepPeriodNs=" + stepPeriodNs + ", exchangeEverySteps=" + exchangeEverySteps
                + ", durationSteps=" + durationSteps + ", realTime=" + realTime + ", watchdogNs=" + watchdogNs
                + ", ringSize=" + ringSize + ", pinCpu=" + pinCpu + ", stopOnTrip=" + stopOnTrip
                + ", missedTickPolicy=" + missedTickPolicy + ", offlineBackpressure=" + offlineBackpressure
                + ", pitchRefRad=[" + pitchRefMinRad + ", " + pitchRefMaxRad + "], timingIntervalNs="
                + timingIntervalNs + ", replyWaitNs=" + replyWaitNs + '}';
    }

    /**
     * Collects the fields; {@link #build()} checks them all and names the first bad one:
     * stepPeriodNs in [1 us, 1 s]; exchangeEverySteps in [1, 1 000 000]; durationSteps &gt; 0;
     * watchdogNs &gt; 0; ringSize a power of two in [2, 2^24]; pinCpu &ge; -1; pitch limits
     * finite with min &lt; max; timingIntervalNs in [1 ms, 1 h]; replyWaitNs in [0, 10 s].
     */
    public static final class Builder {
        private long stepPeriodNs = 50_000;
        private int exchangeEverySteps = 1;
        private long durationSteps = Long.MAX_VALUE;
        private boolean realTime = true;
        private long watchdogNs = 20_000_000;
        private int ringSize = 16_384;
        private int pinCpu = -1;
        private boolean stopOnTrip;
        private MissedTickPolicy missedTickPolicy = MissedTickPolicy.CATCH_UP;
        private boolean offlineBackpressure = true;
        private double pitchRefMinRad = Math.toRadians(-10.0);
        private double pitchRefMaxRad = Math.toRadians(90.0);
        private long timingIntervalNs = 1_000_000_000L;
        private long replyWaitNs;

        private Builder() {
        }

        public Builder stepPeriodNs(long v) { stepPeriodNs = v; return this; }
        public Builder exchangeEverySteps(int v) { exchangeEverySteps = v; return this; }
        public Builder durationSteps(long v) { durationSteps = v; return this; }
        public Builder realTime(boolean v) { realTime = v; return this; }
        public Builder watchdogNs(long v) { watchdogNs = v; return this; }
        public Builder ringSize(int v) { ringSize = v; return this; }
        public Builder pinCpu(int v) { pinCpu = v; return this; }
        public Builder stopOnTrip(boolean v) { stopOnTrip = v; return this; }
        public Builder missedTickPolicy(MissedTickPolicy v) { missedTickPolicy = v; return this; }
        public Builder offlineBackpressure(boolean v) { offlineBackpressure = v; return this; }
        public Builder pitchRefLimitsRad(double minRad, double maxRad) { pitchRefMinRad = minRad; pitchRefMaxRad = maxRad; return this; }
        public Builder timingIntervalNs(long v) { timingIntervalNs = v; return this; }
        public Builder replyWaitNs(long v) { replyWaitNs = v; return this; }

        /** @throws IllegalArgumentException naming the first field out of range */
        public LoopConfig build() {
            check(stepPeriodNs >= 1_000 && stepPeriodNs <= 1_000_000_000L, "stepPeriodNs", stepPeriodNs, "[1000, 1e9] ns");
            check(exchangeEverySteps >= 1 && exchangeEverySteps <= 1_000_000, "exchangeEverySteps", exchangeEverySteps, "[1, 1000000]");
            check(durationSteps > 0, "durationSteps", durationSteps, "> 0 (Long.MAX_VALUE = until aborted)");
            check(watchdogNs > 0, "watchdogNs", watchdogNs, "> 0");
            check(ringSize >= 2 && ringSize <= (1 << 24) && Integer.bitCount(ringSize) == 1, "ringSize", ringSize, "a power of two in [2, 16777216]");
            check(pinCpu >= -1, "pinCpu", pinCpu, ">= -1 (-1 = no pinning)");
            if (missedTickPolicy == null) {
                throw new IllegalArgumentException("loop config: missedTickPolicy must be set");
            }
            if (!(Double.isFinite(pitchRefMinRad) && Double.isFinite(pitchRefMaxRad) && pitchRefMinRad < pitchRefMaxRad)) {
                throw new IllegalArgumentException("loop config: pitch reference limits must be finite with min < max, got ["
                        + pitchRefMinRad + ", " + pitchRefMaxRad + "] rad");
            }
            check(timingIntervalNs >= 1_000_000 && timingIntervalNs <= 3_600_000_000_000L, "timingIntervalNs", timingIntervalNs, "[1e6, 3.6e12] ns");
            check(replyWaitNs >= 0 && replyWaitNs <= 10_000_000_000L, "replyWaitNs", replyWaitNs, "[0, 1e10] ns (0 = strict real time)");
            return new LoopConfig(this);
        }

        private static void check(boolean ok, String field, long value, String range) {
            if (!ok) {
                throw new IllegalArgumentException("loop config: " + field + " = " + value + " is outside " + range);
            }
        }
    }
}
