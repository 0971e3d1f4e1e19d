package dev.galebench.dashboard;

import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import dev.galebench.rt.LinkCounters;
import dev.galebench.rt.Sample;
import dev.galebench.rt.SampleConsumer;
import org.HdrHistogram.Histogram;

import java.util.ArrayList;
import java.util.List;

/**
 * The console's ring consumer: reduces the sample stream to what a browser can draw and hands
 * it to the {@link TelemetryHub}. Runs on the ring's consumer thread, never on the real-time one.
 *
 * <p>Decimation: every bucket of {@code bucketNs} plant time (default 20 ms, i.e. 400 exchanges
 * at 50 us) becomes one min/max pair per plotted signal, so a spike of a single exchange is
 * still visible in the plot (a mean or a pick-every-Nth would hide it). Buckets are sent in
 * batches at most every {@value #FLUSH_INTERVAL_MS} ms of wall time. If the stream runs faster
 * than real time (offline runs) and a batch fills up ({@value #MAX_BATCH_BUCKETS} buckets)
 * before that, the bucket width doubles, so the data rate to browsers stays bounded whatever
 * the run speed; each batch states its bucket width.
 *
 * <p>Timing: every exchange's {@code lateness_us} and {@code rtt_us} (when the layout has
 * them) go into HdrHistograms here, off the real-time thread, giving a live lateness histogram
 * and percentiles for the whole stream. Overruns and link counters come from the
 * {@link TimingSource}, read with each timing message (about twice a second).
 *
 * <p>Cost per sample: one comparison pair per plotted signal plus two histogram records. Per
 * batch it allocates one JSON string; nothing here runs on the real-time thread.
 */
public final class DecimatingFeed implements SampleConsumer {
    static final int MAX_BATCH_BUCKETS = 16;
    static final long FLUSH_INTERVAL_MS = 100;
    static final long TIMING_INTERVAL_MS = 500;
    /** Histogram range: lateness and round trips up to 60 s are recorded; longer ones clamp. */
    private static final long HISTOGRAM_MAX_NS = 60_000_000_000L;
    /** Upper edges of the displayed lateness bins, us (last bin: everything above). */
    static final long[] LATENESS_BIN_EDGES_US = {1, 2, 5, 10, 20, 50, 100, 200, 500, 1000, 2000, 5000};

    private final TelemetryHub hub;
    private final List<String> wanted;
    private final long bucketNs;
    private volatile TimingSource timingSource;
    private final BenchCounters snapshot = new BenchCounters();
    private final Histogram lateness = new Histogram(1, HISTOGRAM_MAX_NS, 2);
    private final Histogram roundTrip = new Histogram(1, HISTOGRAM_MAX_NS, 2);
    private final StringBuilder text = new StringBuilder(8192);

    private int[] signalIndex = new int[0];
    private int latenessIndex = -1;
    private int rttIndex = -1;
    private long exchangePeriodNs;
    private long bucketExchanges;
    private long inBucket;
    private double bucketStartS;
    private double[] bucketMin = new double[0];
    private double[] bucketMax = new double[0];
    private final double[] batchTimeS = new double[MAX_BATCH_BUCKETS];
    private double[][] batchMin = new double[0][];
    private double[][] batchMax = new double[0][];
    private int batchCount;
    private long lastFlushWallNs;
    private long lastTimingWallNs;
    private long samplesSeen;
    private long timingSourceErrors;
    private volatile boolean streaming;
    private long streamCpuStartNs;
    private volatile long lastStreamCpuNs = -1;
    private static final java.lang.management.ThreadMXBean THREADS = java.lang.management.ManagementFactory.getThreadMXBean();

    DecimatingFeed(TelemetryHub hub, List<String> plotSignals, long bucketNs, TimingSource timingSource) {
        this.hub = hub;
        this.wanted = List.copyOf(plotSignals);
        this.bucketNs = bucketNs;
        this.timingSource = timingSource;
    }

    /** Replaces the counter source (e.g. a new run's loop); null = none. */
    public void timingSource(TimingSource source) {
        this.timingSource = source;
    }

    /** True between {@link #onStart} and {@link #onEnd}. */
    public boolean streaming() {
        return streaming;
    }

    @Override
    public void onStart(String[] signalNames, String[] signalUnits, long stepPeriodNs, int exchangeEverySteps) {
        List<Integer> idx = new ArrayList<>();
        List<String> names = new ArrayList<>();
        List<String> units = new ArrayList<>();
        latenessIndex = -1;
        rttIndex = -1;
        for (int i = 0; i < signalNames.length; i++) {
            if ("lateness_us".equals(signalNames[i])) {
                latenessIndex = i;
            } else if ("rtt_us".equals(signalNames[i])) {
                rttIndex = i;
            }
        }
        for (String w : wanted) {
            for (int i = 0; i < signalNames.length; i++) {
                if (w.equals(signalNames[i])) {
                    idx.add(i);
                    names.add(signalNames[i]);
                    units.add(signalUnits == null || i >= signalUnits.length ? "" : signalUnits[i]);
                    break;
                }
            }
        }
        int n = idx.size();
        signalIndex = new int[n];
        for (int i = 0; i < n; i++) {
            signalIndex[i] = idx.get(i);
        }
        bucketMin = new double[n];
        bucketMax = new double[n];
        batchMin = new double[n][MAX_BATCH_BUCKETS];
        batchMax = new double[n][MAX_BATCH_BUCKETS];
        exchangePeriodNs = Math.max(1L, stepPeriodNs * Math.max(1, exchangeEverySteps));
        bucketExchanges = Math.max(1L, Math.round((double) bucketNs / exchangePeriodNs));
        inBucket = 0;
        batchCount = 0;
        samplesSeen = 0;
        lateness.reset();
        roundTrip.reset();
        lastFlushWallNs = System.nanoTime();
        lastTimingWallNs = lastFlushWallNs;
        streamCpuStartNs = THREADS.getCurrentThreadCpuTime();
        hub.startStream(names.toArray(new String[0]), units.toArray(new String[0]),
                bucketExchanges * exchangePeriodNs * 1e-9, exchangePeriodNs * 1e-9);
        streaming = true;
    }

    @Override
    public void onSample(Sample sample) {
        final double[] v = sample.values;
        final int[] idx = signalIndex;
        final int n = idx.length;
        samplesSeen++;
        if (inBucket == 0) {
            bucketStartS = sample.plantTimeNs * 1e-9;
            for (int i = 0; i < n; i++) {
                bucketMin[i] = Double.NaN;
                bucketMax[i] = Double.NaN;
            }
        }
        for (int i = 0; i < n; i++) {
            final double x = v[idx[i]];
            if (x == x) { // not NaN
                final double lo = bucketMin[i];
                if (!(lo <= x)) {
                    bucketMin[i] = x;
                }
                final double hi = bucketMax[i];
                if (!(hi >= x)) {
                    bucketMax[i] = x;
                }
            }
        }
        if (latenessIndex >= 0) {
            record(lateness, v[latenessIndex]);
        }
        if (rttIndex >= 0) {
            record(roundTrip, v[rttIndex]);
        }
        if (++inBucket >= bucketExchanges) {
            closeBucket();
        }
    }

    @Override
    public void onEnd(long samplesMissed) {
        if (inBucket > 0) {
            closeBucket();
        }
        if (batchCount > 0) {
            flush();
        }
        publishTiming(samplesMissed);
        streaming = false;
        hub.endStream(samplesMissed);
        lastStreamCpuNs = THREADS.getCurrentThreadCpuTime() - streamCpuStartNs;
    }

    /**
     * CPU time the feed used on its consumer thread during the last complete stream, ns (-1 before
     * one ended): what the console costs the machine besides the network thread.
     */
    public long lastStreamCpuNs() {
        return lastStreamCpuNs;
    }

    private static void record(Histogram h, double us) {
        if (us == us) {
            long ns = (long) (us * 1000.0);
            if (ns < 1) {
                ns = 1;
            } else if (ns > HISTOGRAM_MAX_NS) {
                ns = HISTOGRAM_MAX_NS;
            }
            h.recordValue(ns);
        }
    }

    private void closeBucket() {
        final int b = batchCount;
        batchTimeS[b] = bucketStartS;
        for (int i = 0; i < signalIndex.length; i++) {
            batchMin[i][b] = bucketMin[i];
            batchMax[i][b] = bucketMax[i];
        }
        batchCount = b + 1;
        inBucket = 0;
        final long now = System.nanoTime();
        if (batchCount == MAX_BATCH_BUCKETS) {
            boolean tooFast = now - lastFlushWallNs < FLUSH_INTERVAL_MS * 1_000_000L;
            flush();
            if (tooFast) {
                bucketExchanges *= 2; // faster than real time: widen buckets, keep the rate bounded
            }
        } else if (now - lastFlushWallNs >= FLUSH_INTERVAL_MS * 1_000_000L) {
            flush();
        }
        if (now - lastTimingWallNs >= TIMING_INTERVAL_MS * 1_000_000L) {
            lastTimingWallNs = now;
            publishTiming(-1);
        }
    }

    private void flush() {
        final StringBuilder s = text;
        s.setLength(0);
        s.append(",\"bucketS\":");
        appendNumber(s, bucketExchanges * exchangePeriodNs * 1e-9);
        s.append(",\"t\":[");
        for (int b = 0; b < batchCount; b++) {
            if (b > 0) {
                s.append(',');
            }
            appendNumber(s, Math.round(batchTimeS[b] * 1e6) / 1e6); // us resolution, short text
        }
        s.append("],\"min\":[");
        appendColumns(s, batchMin);
        s.append("],\"max\":[");
        appendColumns(s, batchMax);
        s.append(']');
        hub.publishData(s);
        batchCount = 0;
        lastFlushWallNs = System.nanoTime();
    }

    private void appendColumns(StringBuilder s, double[][] columns) {
        for (int i = 0; i < columns.length; i++) {
            if (i > 0) {
                s.append(',');
            }
            s.append('[');
            final double[] c = columns[i];
            for (int b = 0; b < batchCount; b++) {
                if (b > 0) {
                    s.append(',');
                }
                appendValue(s, c[b]);
            }
            s.append(']');
        }
    }

    /** A plotted value: float precision (7 digits) keeps batches small and is plenty for a plot. */
    private static void appendValue(StringBuilder s, double x) {
        if (Double.isNaN(x) || Double.isInfinite(x)) {
            s.append("null");
        } else {
            s.append((float) x);
        }
    }

    private static void appendNumber(StringBuilder s, double x) {
        if (Double.isNaN(x) || Double.isInfinite(x)) {
            s.append("null");
        } else {
            s.append(x);
        }
    }

    /** {@code samplesMissed} &lt; 0: not known yet (stream still running). */
    private void publishTiming(long samplesMissed) {
        ObjectNode m = hub.message("timing");
        m.put("samples", samplesSeen);
        if (samplesMissed >= 0) {
            m.put("samplesMissed", samplesMissed);
        }
        if (latenessIndex >= 0) {
            ObjectNode l = percentiles(m.putObject("lateness"), lateness);
            ArrayNode bins = l.putArray("bins");
            long low = 0;
            for (long edgeUs : LATENESS_BIN_EDGES_US) {
                long highNs = edgeUs * 1000 - 1;
                bins.addObject().put("upToUs", edgeUs).put("count", count(lateness, low, highNs));
                low = highNs + 1;
            }
            bins.addObject().putNull("upToUs").put("count", count(lateness, low, HISTOGRAM_MAX_NS));
        }
        if (rttIndex >= 0) {
            percentiles(m.putObject("roundTrip"), roundTrip);
        }
        TimingSource source = timingSource;
        if (source != null) {
            snapshot.clear();
            try {
                source.read(snapshot);
                m.put("exchanges", snapshot.exchanges);
                m.put("overruns", snapshot.overruns);
                if (snapshot.samplesDropped >= 0) {
                    m.put("samplesDropped", snapshot.samplesDropped);
                }
                if (snapshot.linkPresent) {
                    ObjectNode k = m.putObject("link");
                    LinkCounters c = snapshot.link;
                    k.put("framesSent", c.framesSent);
                    k.put("repliesAccepted", c.repliesAccepted);
                    k.put("crcErrors", c.crcErrors);
                    k.put("malformedFrames", c.malformedFrames);
                    k.put("lateReplies", c.lateReplies);
                    k.put("staleReplies", c.staleReplies);
                    k.put("duplicateReplies", c.duplicateReplies);
                    k.put("missingReplies", c.missingReplies);
                    k.put("invalidReferences", c.invalidReferences);
                    k.put("sendFailures", c.sendFailures);
                    k.put("watchdogTrips", c.watchdogTrips);
                }
            } catch (RuntimeException e) {
                timingSourceErrors++;
                m.put("timingSourceErrors", timingSourceErrors);
            }
        }
        hub.publishTiming(m.toString());
    }

    private static long count(Histogram h, long lowNs, long highNs) {
        return h.getTotalCount() == 0 ? 0 : h.getCountBetweenValues(lowNs, highNs);
    }

    private static ObjectNode percentiles(ObjectNode o, Histogram h) {
        o.put("count", h.getTotalCount());
        if (h.getTotalCount() > 0) {
            o.put("p50Us", h.getValueAtPercentile(50.0) / 1000.0);
            o.put("p99Us", h.getValueAtPercentile(99.0) / 1000.0);
            o.put("p999Us", h.getValueAtPercentile(99.9) / 1000.0);
            o.put("maxUs", h.getMaxValue() / 1000.0);
        }
        return o;
    }
}
