package dev.galebench.report;

import dev.galebench.rt.LinkCounters;
import org.HdrHistogram.Histogram;

import java.time.Instant;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * Everything the end-of-run reports ({@code report.html}, {@code junit.xml},
 * {@code summary.json}) are made from. The waveforms are not in here: the HTML report reads
 * them back, decimated, from the run's COMTRADE recording ({@link #comtradeBaseName}), so
 * nothing holds a whole run in memory.
 *
 * <table>
 *   <caption>Components</caption>
 *   <tr><th>component</th><th>unit</th><th>meaning</th></tr>
 *   <tr><td>sequenceName</td><td>-</td><td>sequence name (the junit testsuite name)</td></tr>
 *   <tr><td>sequenceFile</td><td>-</td><td>path of the sequence file as given, or null</td></tr>
 *   <tr><td>description</td><td>-</td><td>one-paragraph description from the sequence file, or null</td></tr>
 *   <tr><td>passed</td><td>-</td><td>overall verdict decided by the runner (false if any check failed, the run aborted or samples were lost)</td></tr>
 *   <tr><td>abortedReason</td><td>-</td><td>why the run stopped early, or null when it completed</td></tr>
 *   <tr><td>checks</td><td>-</td><td>one outcome per check, in sequence order</td></tr>
 *   <tr><td>latenessNs</td><td>ns</td><td>tick lateness against t0 + k*h, per exchange; may be null</td></tr>
 *   <tr><td>computeNs</td><td>ns</td><td>plant compute time per exchange; may be null</td></tr>
 *   <tr><td>roundTripNs</td><td>ns</td><td>board round trip per exchange; may be null (offline run)</td></tr>
 *   <tr><td>overruns</td><td>exchanges</td><td>ticks late by more than one period</td></tr>
 *   <tr><td>exchanges</td><td>exchanges</td><td>exchanges done</td></tr>
 *   <tr><td>link</td><td>-</td><td>snapshot of the link's fault counters; may be null (offline run)</td></tr>
 *   <tr><td>samplesDropped</td><td>samples</td><td>samples a ring consumer missed (recorder, checker)</td></tr>
 *   <tr><td>environment</td><td>-</td><td>JVM, flags, CPU, OS, host, link, build; shown as given, in order</td></tr>
 *   <tr><td>stepPeriodNs</td><td>ns</td><td>plant step h</td></tr>
 *   <tr><td>exchangeEverySteps</td><td>steps</td><td>M: one exchange with the board every M plant steps</td></tr>
 *   <tr><td>startedAt</td><td>UTC instant</td><td>wall-clock start of the run</td></tr>
 *   <tr><td>plantDurationS</td><td>s</td><td>plant time covered by the run</td></tr>
 *   <tr><td>comtradeBaseName</td><td>-</td><td>base name of the .cfg/.dat in the run folder, or null if none was recorded</td></tr>
 *   <tr><td>csvFileName</td><td>-</td><td>CSV file in the run folder, or null</td></tr>
 *   <tr><td>timingLogFileName</td><td>-</td><td>HdrHistogram interval log in the run folder (normally {@code timing.hlog}), or null</td></tr>
 *   <tr><td>plotSignals</td><td>-</td><td>extra signals to plot besides those the checks use (e.g. v_term_pu, v_dc_v)</td></tr>
 *   <tr><td>loopSummary</td><td>-</td><td>the loop's own summary ({@code LoopResult.summary()}: stop reason, wall time, skipped exchanges, reply age, samples missed per consumer, ...), or null</td></tr>
 *   <tr><td>recording</td><td>-</td><td>the COMTRADE recorder's counters ({@link RecordingStats#of}), or null</td></tr>
 * </table>
 */
public record RunReportInput(String sequenceName, String sequenceFile, String description, boolean passed,
                             String abortedReason, List<CheckOutcome> checks, Histogram latenessNs,
                             Histogram computeNs, Histogram roundTripNs, long overruns, long exchanges,
                             LinkCounters link, long samplesDropped, Map<String, String> environment,
                             long stepPeriodNs, int exchangeEverySteps, Instant startedAt, double plantDurationS,
                             String comtradeBaseName, String csvFileName, String timingLogFileName,
                             List<String> plotSignals, RecordingStats recording, Map<String, Object> loopSummary) {
    public RunReportInput {
        if (sequenceName == null || sequenceName.isBlank()) {
            throw new IllegalArgumentException("sequence name is required");
        }
        checks = List.copyOf(checks);
        environment = environment == null ? Map.of() : java.util.Collections.unmodifiableMap(new LinkedHashMap<>(environment));
        plotSignals = plotSignals == null ? List.of() : List.copyOf(plotSignals);
        loopSummary = loopSummary == null ? null : java.util.Collections.unmodifiableMap(new LinkedHashMap<>(loopSummary));
        if (startedAt == null) {
            throw new IllegalArgumentException("startedAt is required");
        }
    }

    /** "pass" or "fail", as summary.json writes it. */
    public String verdict() {
        return passed ? "pass" : "fail";
    }

    /** Number of failed checks. */
    public long failedCheckCount() {
        return checks.stream().filter(c -> !c.passed()).count();
    }

    /** A builder, so callers set only what they have. */
    public static Builder builder(String sequenceName) {
        return new Builder(sequenceName);
    }

    /** Mutable builder for {@link RunReportInput}; defaults: no checks, passed, h = 50 us, M = 1, started now. */
    public static final class Builder {
        private final String sequenceName;
        private String sequenceFile;
        private String description;
        private boolean passed = true;
        private String abortedReason;
        private List<CheckOutcome> checks = List.of();
        private Histogram latenessNs;
        private Histogram computeNs;
        private Histogram roundTripNs;
        private long overruns;
        private long exchanges;
        private LinkCounters link;
        private long samplesDropped;
        private Map<String, String> environment = Map.of();
        private long stepPeriodNs = 50_000L;
        private int exchangeEverySteps = 1;
        private Instant startedAt = Instant.now();
        private double plantDurationS;
        private String comtradeBaseName;
        private String csvFileName;
        private String timingLogFileName;
        private List<String> plotSignals = List.of();
        private RecordingStats recording;
        private Map<String, Object> loopSummary;

        private Builder(String sequenceName) {
            this.sequenceName = sequenceName;
        }

        public Builder sequenceFile(String v) { sequenceFile = v; return this; }
        public Builder description(String v) { description = v; return this; }
        public Builder passed(boolean v) { passed = v; return this; }
        public Builder abortedReason(String v) { abortedReason = v; return this; }
        public Builder checks(List<CheckOutcome> v) { checks = v; return this; }
        public Builder latenessNs(Histogram v) { latenessNs = v; return this; }
        public Builder computeNs(Histogram v) { computeNs = v; return this; }
        public Builder roundTripNs(Histogram v) { roundTripNs = v; return this; }
        public Builder overruns(long v) { overruns = v; return this; }
        public Builder exchanges(long v) { exchanges = v; return this; }
        public Builder link(LinkCounters v) { link = v; return this; }
        public Builder samplesDropped(long v) { samplesDropped = v; return this; }
        public Builder environment(Map<String, String> v) { environment = v; return this; }
        public Builder stepPeriodNs(long v) { stepPeriodNs = v; return this; }
        public Builder exchangeEverySteps(int v) { exchangeEverySteps = v; return this; }
        public Builder startedAt(Instant v) { startedAt = v; return this; }
        public Builder plantDurationS(double v) { plantDurationS = v; return this; }
        public Builder comtradeBaseName(String v) { comtradeBaseName = v; return this; }
        public Builder csvFileName(String v) { csvFileName = v; return this; }
        public Builder timingLogFileName(String v) { timingLogFileName = v; return this; }
        public Builder plotSignals(List<String> v) { plotSignals = v; return this; }
        public Builder recording(RecordingStats v) { recording = v; return this; }
        public Builder loopSummary(Map<String, Object> v) { loopSummary = v; return this; }

        /**
         * Takes everything the real-time loop measured: timing histograms, overruns, exchanges,
         * link counters, samples missed by all consumers, step and exchange settings, plant
         * time, and the loop's own summary map. A run stopped by an abort or an error gets {@code abortedReason} = stop reason
         * and detail; a plant trip is a completed run whose checks judge it. The verdict stays
         * the caller's.
         */
        public Builder fromLoop(dev.galebench.rt.LoopResult r) {
            latenessNs = r.latenessNs;
            computeNs = r.computeNs;
            roundTripNs = r.roundTripNs;
            overruns = r.overruns;
            exchanges = r.exchanges;
            link = r.linkCounters;
            samplesDropped = r.totalSamplesMissed();
            stepPeriodNs = r.config.stepPeriodNs;
            exchangeEverySteps = r.config.exchangeEverySteps;
            plantDurationS = r.steps * (double) r.config.stepPeriodNs * 1e-9;
            loopSummary = r.summary();
            if (r.aborted()) {
                abortedReason = r.stopReason.name().toLowerCase(java.util.Locale.ROOT)
                        + (r.stopDetail == null || r.stopDetail.isEmpty() ? "" : ": " + r.stopDetail);
            }
            return this;
        }

        public RunReportInput build() {
            return new RunReportInput(sequenceName, sequenceFile, description, passed, abortedReason, checks,
                    latenessNs, computeNs, roundTripNs, overruns, exchanges, link, samplesDropped, environment,
                    stepPeriodNs, exchangeEverySteps, startedAt, plantDurationS, comtradeBaseName, csvFileName,
                    timingLogFileName, plotSignals, recording, loopSummary);
        }
    }
}
