package dev.galebench.report.recording;

import dev.galebench.rt.Sample;
import dev.galebench.rt.SampleConsumer;

import java.io.BufferedWriter;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

/**
 * Streams samples into a CSV file for spreadsheets and scripts (on request; the COMTRADE
 * recording is the reference). Layout: a header line {@code exchange,time_s,<signal names>},
 * then one line per kept sample; {@code time_s} is plant time in plain decimal notation with
 * up to 9 decimals, values use Java's shortest round-trip decimal form ({@code 1.0E-5} style
 * exponents for very small or large magnitudes), NaN is an empty field. Comma separator,
 * LF line ends, UTF-8. Signal names carry their unit (see SIGNALS.md), so no unit row is needed.
 *
 * <p>Buffered (64 KiB) and flushed at least once per second of wall-clock time, checked at
 * each sample, so a killed run leaves every line up to the last second. Text formatting
 * allocates a little per value; it runs on a consumer thread, never on the real-time thread.
 * A full 50 us run writes about 20 000 lines per second, so for long runs pass a
 * {@code keepEvery} above 1 or a short signal list. An I/O error stops the file; it is kept in
 * {@link #failure()} and later samples are counted in {@link #unrecordedSampleCount()}.
 */
public final class CsvRecorder implements SampleConsumer {
    private final Path file;
    private final List<String> wanted;
    private final int keepEvery;
    private final long flushIntervalNs;
    private BufferedWriter out;
    private int[] columns = new int[0];
    private long seen;
    private long written;
    private long lastFlushWallNs;
    private long unrecorded;
    private long samplesMissed;
    private IOException failure;

    /**
     * @param file      CSV file to write (replaced)
     * @param signals   signals to write, in this order; null or empty = every signal of the run
     * @param keepEvery write every keepEvery-th sample (1 = all)
     */
    public CsvRecorder(Path file, List<String> signals, int keepEvery) {
        this(file, signals, keepEvery, 1_000_000_000L);
    }

    /** As above with a shorter flush interval (tests). */
    CsvRecorder(Path file, List<String> signals, int keepEvery, long flushIntervalNs) {
        if (flushIntervalNs <= 0 || flushIntervalNs > 1_000_000_000L) {
            throw new IllegalArgumentException("flush interval must be in (0, 1 s], got " + flushIntervalNs + " ns");
        }
        if (keepEvery < 1) {
            throw new IllegalArgumentException("keepEvery must be >= 1, got " + keepEvery);
        }
        this.file = file;
        this.wanted = signals == null ? List.of() : List.copyOf(signals);
        this.keepEvery = keepEvery;
        this.flushIntervalNs = flushIntervalNs;
    }

    @Override
    public void onStart(String[] signalNames, String[] signalUnits, long stepPeriodNs, int exchangeEverySteps) {
        List<Integer> cols = new ArrayList<>();
        if (wanted.isEmpty()) {
            for (int i = 0; i < signalNames.length; i++) {
                cols.add(i);
            }
        } else {
            for (String w : wanted) {
                int idx = List.of(signalNames).indexOf(w);
                if (idx < 0) {
                    throw new IllegalArgumentException("CSV signal '" + w + "' is not recorded in this run");
                }
                cols.add(idx);
            }
        }
        columns = cols.stream().mapToInt(Integer::intValue).toArray();
        try {
            out = Files.newBufferedWriter(file, StandardCharsets.UTF_8);
            StringBuilder h = new StringBuilder("exchange,time_s");
            for (int c : columns) {
                h.append(',').append(signalNames[c]);
            }
            out.write(h.append('\n').toString());
            out.flush();
        } catch (IOException e) {
            failure = e;
        }
        lastFlushWallNs = System.nanoTime();
    }

    @Override
    public void onSample(Sample sample) {
        if (seen++ % keepEvery != 0) {
            return;
        }
        if (failure != null || out == null) {
            unrecorded++;
            return;
        }
        StringBuilder s = new StringBuilder(16 * (columns.length + 2));
        s.append(sample.exchangeIndex).append(',');
        appendSeconds(s, sample.plantTimeNs);
        for (int c : columns) {
            s.append(',');
            double v = sample.values[c];
            if (!Double.isNaN(v)) {
                s.append(v);
            }
        }
        s.append('\n');
        try {
            out.write(s.toString());
            written++;
            long now = System.nanoTime();
            if (now - lastFlushWallNs >= flushIntervalNs) {
                out.flush();
                lastFlushWallNs = now;
            }
        } catch (IOException e) {
            failure = e;
            unrecorded++;
        }
    }

    @Override
    public void onEnd(long samplesMissed) {
        this.samplesMissed = samplesMissed;
        if (out == null) {
            return;
        }
        try {
            out.close();
        } catch (IOException e) {
            if (failure == null) {
                failure = e;
            }
        }
        out = null;
    }

    static void appendSeconds(StringBuilder s, long ns) {
        if (ns < 0) {
            s.append('-');
            ns = -ns;
        }
        s.append(ns / 1_000_000_000L);
        long frac = ns % 1_000_000_000L;
        if (frac != 0) {
            String f = Long.toString(1_000_000_000L + frac).substring(1);
            int end = f.length();
            while (f.charAt(end - 1) == '0') {
                end--;
            }
            s.append('.').append(f, 0, end);
        }
    }

    /** Lines written (without the header). */
    public long writtenLineCount() {
        return written;
    }

    public long unrecordedSampleCount() {
        return unrecorded;
    }

    public long samplesMissed() {
        return samplesMissed;
    }

    public IOException failure() {
        return failure;
    }

    public Path file() {
        return file;
    }
}
