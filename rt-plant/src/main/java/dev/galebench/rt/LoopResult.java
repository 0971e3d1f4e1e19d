package dev.galebench.rt;

import org.HdrHistogram.Histogram;
import org.HdrHistogram.HistogramLogWriter;

import java.io.IOException;
import java.io.OutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * Everything a finished run of the {@link RealTimeLoop} reports. Histograms are copies of the
 * whole run (ns for times, exchanges for reply age); counters are final values.
 */
public final class LoopResult {
    /** Why the run ended. */
    public enum StopReason {
        /** durationSteps reached. */
        COMPLETED,
        /** {@link RealTimeLoop#abort} was called. */
        ABORTED,
        /** stopOnTrip and the plant latched a trip. */
        PLANT_TRIP,
        /** The plant, a hook or the link threw on the real-time thread. */
        ERROR
    }

    public final LoopConfig config;
    public final long exchanges;
    public final long steps;
    /** Exchanges that started more than one exchange period after their deadline. */
    public final long overruns;
    /** Deadlines dropped under {@link MissedTickPolicy#SKIP} (0 under CATCH_UP). */
    public final long skippedExchanges;
    public final Histogram latenessNs;
    public final Histogram computeNs;
    public final Histogram roundTripNs;
    public final Histogram replyAgeExchanges;
    /** Timing values clamped into the histograms' range (should be 0). */
    public final long clampedTimingValues;
    /** Names of the consumers, in the order given to the loop. */
    public final List<String> consumerNames;
    /** Samples each consumer missed, same order. */
    public final long[] samplesMissed;
    /** Exceptions each consumer threw, same order. */
    public final long[] consumerErrors;
    /** Replies that passed supervision (link-valid, newest, in range) and were applied. */
    public final long repliesApplied;
    /** Copy of the link's counters at the end. */
    public final LinkCounters linkCounters;
    /** Latched plant trip bits at the end. */
    public final int tripFlags;
    public final StopReason stopReason;
    /** Human-readable detail of the stop (abort reason, exception). */
    public final String stopDetail;
    /** Wall time from the first deadline to the end of the last exchange, ns. */
    public final long wallTimeNs;
    /** Outcome of CPU pinning ("not requested" if pinCpu was -1). */
    public final String pinning;

    private final byte[] intervalLogBody;
    private final long baseTimeMs;

    LoopResult(LoopConfig config, long exchanges, long steps, long overruns, long skippedExchanges,
               Histogram latenessNs, Histogram computeNs, Histogram roundTripNs, Histogram replyAgeExchanges,
               long clampedTimingValues, List<String> consumerNames, long[] samplesMissed, long[] consumerErrors,
               long repliesApplied, LinkCounters linkCounters, int tripFlags, StopReason stopReason, String stopDetail,
               long wallTimeNs, String pinning, byte[] intervalLogBody, long baseTimeMs) {
        this.config = config;
        this.exchanges = exchanges;
        this.steps = steps;
        this.overruns = overruns;
        this.skippedExchanges = skippedExchanges;
        this.latenessNs = latenessNs;
        this.computeNs = computeNs;
        this.roundTripNs = roundTripNs;
        this.replyAgeExchanges = replyAgeExchanges;
        this.clampedTimingValues = clampedTimingValues;
        this.consumerNames = List.copyOf(consumerNames);
        this.samplesMissed = samplesMissed;
        this.consumerErrors = consumerErrors;
        this.repliesApplied = repliesApplied;
        this.linkCounters = linkCounters;
        this.tripFlags = tripFlags;
        this.stopReason = stopReason;
        this.stopDetail = stopDetail;
        this.wallTimeNs = wallTimeNs;
        this.pinning = pinning;
        this.intervalLogBody = intervalLogBody;
        this.baseTimeMs = baseTimeMs;
    }

    /**
     * One result for several runs made one after the other (e.g. the rounds of a preflight):
     * counters, samples missed and link counters summed (so reset the link's counters between
     * runs), histograms added, trip flags or-ed, the first stop that was not COMPLETED, wall times
     * summed, interval logs concatenated (give the runs the same
     * {@link RealTimeLoop#timingLogBaseTimeMs log base time}). Config and pinning of the first.
     *
     * @throws IllegalArgumentException if {@code parts} is empty or their consumers differ
     */
    public static LoopResult merge(List<LoopResult> parts) {
        if (parts.isEmpty()) {
            throw new IllegalArgumentException("nothing to merge");
        }
        final LoopResult first = parts.get(0);
        final Histogram lateness = first.latenessNs.copy();
        final Histogram compute = first.computeNs.copy();
        final Histogram rtt = first.roundTripNs.copy();
        final Histogram age = first.replyAgeExchanges.copy();
        long exchanges = 0, steps = 0, overruns = 0, skipped = 0, clamped = 0, applied = 0, wall = 0;
        final long[] missed = new long[first.samplesMissed.length];
        final long[] errors = new long[first.consumerErrors.length];
        final LinkCounters link = new LinkCounters();
        int trips = 0;
        StopReason stop = StopReason.COMPLETED;
        String detail = "";
        final java.io.ByteArrayOutputStream log = new java.io.ByteArrayOutputStream();
        for (int i = 0; i < parts.size(); i++) {
            final LoopResult r = parts.get(i);
            if (!r.consumerNames.equals(first.consumerNames)) {
                throw new IllegalArgumentException("runs to merge have different consumers: " + first.consumerNames + " vs " + r.consumerNames);
            }
            if (i > 0) {
                lateness.add(r.latenessNs);
                compute.add(r.computeNs);
                rtt.add(r.roundTripNs);
                age.add(r.replyAgeExchanges);
            }
            exchanges += r.exchanges;
            steps += r.steps;
            overruns += r.overruns;
            skipped += r.skippedExchanges;
            clamped += r.clampedTimingValues;
            applied += r.repliesApplied;
            wall += r.wallTimeNs;
            for (int c = 0; c < missed.length; c++) {
                missed[c] += r.samplesMissed[c];
                errors[c] += r.consumerErrors[c];
            }
            final LinkCounters o = r.linkCounters;
            link.framesSent += o.framesSent;
            link.repliesAccepted += o.repliesAccepted;
            link.crcErrors += o.crcErrors;
            link.malformedFrames += o.malformedFrames;
            link.lateReplies += o.lateReplies;
            link.staleReplies += o.staleReplies;
            link.duplicateReplies += o.duplicateReplies;
            link.missingReplies += o.missingReplies;
            link.invalidReferences += o.invalidReferences;
            link.sendFailures += o.sendFailures;
            link.watchdogTrips += o.watchdogTrips;
            trips |= r.tripFlags;
            if (stop == StopReason.COMPLETED && r.stopReason != StopReason.COMPLETED) {
                stop = r.stopReason;
                detail = r.stopDetail;
            }
            log.writeBytes(r.intervalLogBody);
        }
        return new LoopResult(first.config, exchanges, steps, overruns, skipped, lateness, compute, rtt, age, clamped,
                first.consumerNames, missed, errors, applied, link, trips, stop, detail, wall, first.pinning,
                log.toByteArray(), first.baseTimeMs);
    }

    /** True if the run was stopped by {@link RealTimeLoop#abort} or by an error. */
    public boolean aborted() {
        return stopReason == StopReason.ABORTED || stopReason == StopReason.ERROR;
    }

    /** Sum of samples missed over all consumers. */
    public long totalSamplesMissed() {
        long s = 0;
        for (long m : samplesMissed) {
            s += m;
        }
        return s;
    }

    /**
     * Writes the run's timing as an HdrHistogram interval log (conventionally {@code timing.hlog}):
     * one interval per {@code timingIntervalNs}, tags {@code lateness}, {@code compute},
     * {@code rtt} (values in ns) and {@code reply_age} (in exchanges). Readable by
     * {@code HistogramLogReader} and HdrHistogram's log processor ({@code -tag lateness}).
     */
    public void writeTimingLog(Path file) throws IOException {
        try (OutputStream os = Files.newOutputStream(file)) {
            writeTimingLog(os);
        }
    }

    /** Same as {@link #writeTimingLog(Path)} into a stream (not closed). */
    public void writeTimingLog(OutputStream os) throws IOException {
        PrintStream ps = new PrintStream(os, false, StandardCharsets.US_ASCII);
        HistogramLogWriter w = new HistogramLogWriter(ps);
        w.outputComment("galebench loop timing: step " + config.stepPeriodNs + " ns, exchange every "
                + config.exchangeEverySteps + " steps, " + (config.realTime ? "real time" : "offline")
                + "; lateness/compute/rtt in ns, reply_age in exchanges");
        w.outputLogFormatVersion();
        w.outputStartTime(baseTimeMs);
        w.outputBaseTime(baseTimeMs);
        w.outputLegend();
        ps.flush();
        os.write(intervalLogBody);
        os.flush();
    }

    /**
     * The result as plain maps, lists and numbers (for summary.json and reports): counters,
     * percentiles in us (reply age in exchanges), samples missed per consumer, link counters.
     * Key order is stable.
     */
    public Map<String, Object> summary() {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("stop", stopReason.name());
        m.put("stop_detail", stopDetail);
        m.put("real_time", config.realTime);
        m.put("step_us", config.stepPeriodNs / 1e3);
        m.put("exchange_every_steps", config.exchangeEverySteps);
        m.put("exchanges", exchanges);
        m.put("steps", steps);
        m.put("overruns", overruns);
        m.put("skipped_exchanges", skippedExchanges);
        m.put("wall_time_s", wallTimeNs / 1e9);
        m.put("lateness_us", percentiles(latenessNs, 1e-3));
        m.put("compute_us", percentiles(computeNs, 1e-3));
        m.put("rtt_us", percentiles(roundTripNs, 1e-3));
        m.put("reply_age_exchanges", percentiles(replyAgeExchanges, 1.0));
        m.put("clamped_timing_values", clampedTimingValues);
        Map<String, Object> missed = new LinkedHashMap<>();
        for (int i = 0; i < consumerNames.size(); i++) {
            missed.put(consumerNames.get(i), samplesMissed[i]);
        }
        m.put("samples_missed", missed);
        m.put("replies_applied", repliesApplied);
        Map<String, Object> link = new LinkedHashMap<>();
        LinkCounters c = linkCounters;
        link.put("frames_sent", c.framesSent);
        link.put("replies_accepted", c.repliesAccepted);
        link.put("crc_errors", c.crcErrors);
        link.put("malformed_frames", c.malformedFrames);
        link.put("late_replies", c.lateReplies);
        link.put("stale_replies", c.staleReplies);
        link.put("duplicate_replies", c.duplicateReplies);
        link.put("missing_replies", c.missingReplies);
        link.put("invalid_references", c.invalidReferences);
        link.put("send_failures", c.sendFailures);
        link.put("watchdog_trips", c.watchdogTrips);
        m.put("link", link);
        m.put("trip_flags", tripFlags);
        m.put("pinning", pinning);
        return m;
    }

    private static Map<String, Object> percentiles(Histogram h, double scale) {
        Map<String, Object> p = new LinkedHashMap<>();
        final boolean empty = h.getTotalCount() == 0;
        p.put("count", h.getTotalCount());
        p.put("p50", empty ? 0.0 : h.getValueAtPercentile(50.0) * scale);
        p.put("p99", empty ? 0.0 : h.getValueAtPercentile(99.0) * scale);
        p.put("p999", empty ? 0.0 : h.getValueAtPercentile(99.9) * scale);
        p.put("p9999", empty ? 0.0 : h.getValueAtPercentile(99.99) * scale);
        p.put("max", empty ? 0.0 : h.getMaxValue() * scale);
        return p;
    }

    @Override
    public String toString() {
        return "LoopResult{" + stopReason + (stopDetail.isEmpty() ? "" : " (" + stopDetail + ")")
                + ", exchanges=" + exchanges + ", steps=" + steps + ", overruns=" + overruns
                + ", skipped=" + skippedExchanges + ", missed=" + totalSamplesMissed()
                + ", trips=0x" + Integer.toHexString(tripFlags) + ", wallTimeNs=" + wallTimeNs + '}';
    }
}
