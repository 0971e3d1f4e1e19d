package dev.galebench.report.comtrade;

import java.io.IOException;
import java.nio.file.Files;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;

/**
 * Channels of a COMTRADE recording read back with min/max decimation: the records are cut
 * into at most {@code bucketCount} consecutive buckets and each bucket keeps its smallest and
 * largest value, in the order they occurred, with their times. A plot of these 2 points per
 * bucket shows every spike of the full-rate signal (a 50 us spike in a 10-minute run is not
 * averaged away), while memory stays at {@code 4 x bucketCount} doubles per channel whatever the
 * length of the recording.
 *
 * <p>Missing samples (NaN) are skipped; a bucket with no valid sample yields no points.
 */
public final class DecimatedTraces {
    /** One channel: points in time order (two per bucket, one if min and max coincide). */
    public record Trace(String id, String unit, double[] timeS, double[] value) {
        public int size() {
            return timeS.length;
        }
    }

    private final List<Trace> traces;
    private final long recordsRead;
    private final double endTimeS;

    private DecimatedTraces(List<Trace> traces, long recordsRead, double endTimeS) {
        this.traces = traces;
        this.recordsRead = recordsRead;
        this.endTimeS = endTimeS;
    }

    public List<Trace> traces() {
        return traces;
    }

    /** The trace of channel {@code id}, or null. */
    public Trace trace(String id) {
        for (Trace t : traces) {
            if (t.id().equals(id)) {
                return t;
            }
        }
        return null;
    }

    /** Records read from the .dat. */
    public long recordsRead() {
        return recordsRead;
    }

    /** Time of the last record read, s since the first. */
    public double endTimeS() {
        return endTimeS;
    }

    /**
     * Reads the analog or status channels named {@code ids} (unknown ids are skipped; status
     * channels read as 0/1) with at most {@code bucketCount} buckets each.
     */
    public static DecimatedTraces read(ComtradeReader reader, List<String> ids, int bucketCount) throws IOException {
        if (bucketCount < 1) {
            throw new IllegalArgumentException("bucket count must be >= 1");
        }
        ComtradeConfig cfg = reader.config();
        List<String> found = new ArrayList<>();
        List<String> units = new ArrayList<>();
        List<Integer> analogIdx = new ArrayList<>();
        List<Integer> statusIdx = new ArrayList<>();
        for (String id : ids) {
            int a = cfg.analogIndexOf(id);
            int s = a < 0 ? cfg.statusIndexOf(id) : -1;
            if (a >= 0 || s >= 0) {
                found.add(id);
                units.add(a >= 0 ? cfg.analogChannels.get(a).unit() : "state");
                analogIdx.add(a);
                statusIdx.add(s);
            }
        }
        long records = cfg.announcedRecordCount();
        int recordBytes = reader.binaryRecordBytes();
        if (recordBytes > 0) {
            // never more records than are complete in the .dat
            records = Math.min(records, Files.size(reader.datPath()) / recordBytes);
        }
        final long perBucket = Math.max(1, (records + bucketCount - 1) / bucketCount);
        final int channels = found.size();
        final Builder[] builders = new Builder[channels];
        for (int c = 0; c < channels; c++) {
            builders[c] = new Builder(bucketCount);
        }
        final int[] aIdx = analogIdx.stream().mapToInt(Integer::intValue).toArray();
        final int[] sIdx = statusIdx.stream().mapToInt(Integer::intValue).toArray();
        final long[] index = {0};
        final double[] lastTime = {0.0};
        long read = reader.read((n, t, analog, status) -> {
            boolean bucketEnd = (index[0] + 1) % perBucket == 0;
            for (int c = 0; c < channels; c++) {
                double v = aIdx[c] >= 0 ? analog[aIdx[c]] : (status[sIdx[c]] ? 1.0 : 0.0);
                builders[c].add(t, v);
                if (bucketEnd) {
                    builders[c].closeBucket();
                }
            }
            lastTime[0] = t;
            index[0]++;
        });
        List<Trace> out = new ArrayList<>(channels);
        for (int c = 0; c < channels; c++) {
            builders[c].closeBucket();
            out.add(builders[c].build(found.get(c), units.get(c)));
        }
        return new DecimatedTraces(List.copyOf(out), read, lastTime[0]);
    }

    /** A time window of one channel to read: {@code fromS..toS} (s since the first sample) in {@code buckets} equal slices. */
    public record Window(String id, double fromS, double toS, int buckets) {
        public Window {
            if (!(toS > fromS) || buckets < 1) {
                throw new IllegalArgumentException("window of '" + id + "' needs from < to and buckets >= 1, got "
                        + fromS + ".." + toS + " s, " + buckets);
            }
        }
    }

    /**
     * Reads several channel windows in ONE pass over the .dat (each plot of a report is one
     * window; the file may be gigabytes). Buckets are equal slices of time, so zooms on short
     * check windows keep full resolution. Returns one trace per window, in order; a window of an
     * unknown channel gives an empty trace.
     */
    public static List<Trace> readWindows(ComtradeReader reader, List<Window> windows) throws IOException {
        ComtradeConfig cfg = reader.config();
        final int count = windows.size();
        final int[] aIdx = new int[count];
        final int[] sIdx = new int[count];
        final double[] from = new double[count];
        final double[] to = new double[count];
        final int[] buckets = new int[count];
        final int[] current = new int[count];
        final Builder[] builders = new Builder[count];
        for (int i = 0; i < count; i++) {
            Window w = windows.get(i);
            aIdx[i] = cfg.analogIndexOf(w.id());
            sIdx[i] = aIdx[i] < 0 ? cfg.statusIndexOf(w.id()) : -1;
            from[i] = w.fromS();
            to[i] = w.toS();
            buckets[i] = w.buckets();
            current[i] = -1;
            builders[i] = new Builder(w.buckets());
        }
        reader.read((n, t, analog, status) -> {
            for (int i = 0; i < count; i++) {
                if (t < from[i] || t > to[i] || (aIdx[i] < 0 && sIdx[i] < 0)) {
                    continue;
                }
                int b = (int) ((t - from[i]) / (to[i] - from[i]) * buckets[i]);
                if (b >= buckets[i]) {
                    b = buckets[i] - 1;
                }
                if (b != current[i]) {
                    builders[i].closeBucket();
                    current[i] = b;
                }
                builders[i].add(t, aIdx[i] >= 0 ? analog[aIdx[i]] : (status[sIdx[i]] ? 1.0 : 0.0));
            }
        });
        List<Trace> out = new ArrayList<>(count);
        for (int i = 0; i < count; i++) {
            builders[i].closeBucket();
            String id = windows.get(i).id();
            String unit = aIdx[i] >= 0 ? cfg.analogChannels.get(aIdx[i]).unit() : sIdx[i] >= 0 ? "state" : "";
            out.add(builders[i].build(id, unit));
        }
        return out;
    }

    private static final class Builder {
        private double[] t;
        private double[] v;
        private int size;
        private boolean any;
        private double minV;
        private double minT;
        private double maxV;
        private double maxT;

        Builder(int buckets) {
            t = new double[2 * buckets + 2];
            v = new double[2 * buckets + 2];
        }

        void add(double time, double value) {
            if (Double.isNaN(value)) {
                return;
            }
            if (!any) {
                any = true;
                minV = maxV = value;
                minT = maxT = time;
                return;
            }
            if (value < minV) {
                minV = value;
                minT = time;
            }
            if (value > maxV) {
                maxV = value;
                maxT = time;
            }
        }

        void closeBucket() {
            if (!any) {
                return;
            }
            if (size + 2 > t.length) {
                t = Arrays.copyOf(t, t.length * 2);
                v = Arrays.copyOf(v, v.length * 2);
            }
            if (minT == maxT) {
                put(minT, minV);
            } else if (minT < maxT) {
                put(minT, minV);
                put(maxT, maxV);
            } else {
                put(maxT, maxV);
                put(minT, minV);
            }
            any = false;
        }

        private void put(double time, double value) {
            t[size] = time;
            v[size] = value;
            size++;
        }

        Trace build(String id, String unit) {
            return new Trace(id, unit, Arrays.copyOf(t, size), Arrays.copyOf(v, size));
        }
    }
}
