package dev.galebench.runner;

import dev.galebench.check.Fmt;
import dev.galebench.report.comtrade.ComtradeConfig;
import dev.galebench.report.comtrade.ComtradeReader;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ArrayBlockingQueue;
import java.util.concurrent.BlockingQueue;

/**
 * Back-to-back comparison of two recorded runs (their COMTRADE recordings), streaming: run B is
 * read on a helper thread in lock step with run A, B is interpolated linearly to A's sample
 * times, and per signal the maximum and RMS deviation and the lag that maximises the normalised
 * cross-correlation (within {@code +/- maxLagSamples} of A's sample period) are accumulated.
 * Memory is a few arrays per signal, flat for any run length; plots use min/max decimation to
 * {@value #PLOT_BUCKETS} buckets.
 *
 * <p>Resolution: COMTRADE stores 16-bit codes, so deviations below one code step
 * ({@code a} of the channel, range / 65534) are not measurable; the step is reported with each
 * signal.
 */
final class RunComparison {
    static final int PLOT_BUCKETS = 1000;
    private static final double[] END = new double[0];

    /** Per-signal result. */
    record SignalDiff(String signal, String unit, long samples, double maxAbs, double maxAtS, double rms, double lagS,
                      double correlation, double resolution, double tolerance, boolean passed,
                      double[] plotT, double[] plotA, double[] plotB) {
    }

    private RunComparison() {
    }

    static Path cfgOf(Path runDir) throws IOException {
        Path p = runDir.resolve("recording.cfg");
        if (Files.isRegularFile(p)) {
            return p;
        }
        try (var s = Files.list(runDir)) {
            return s.filter(f -> f.toString().toLowerCase(java.util.Locale.ROOT).endsWith(".cfg")).findFirst()
                    .orElseThrow(() -> new IllegalArgumentException(runDir + ": no COMTRADE recording (.cfg) in it"));
        }
    }

    /**
     * Compares {@code signals} of run A and run B.
     *
     * @param tolerances     absolute tolerance per signal (max deviation); missing signals get
     *                       {@code defaultPercent} of A's range (max - min) of that signal
     */
    static List<SignalDiff> compare(Path runA, Path runB, List<String> signals, Map<String, Double> tolerances,
                                    double defaultPercent, int maxLagSamples) throws IOException, InterruptedException {
        ComtradeReader a = ComtradeReader.open(cfgOf(runA));
        ComtradeReader b = ComtradeReader.open(cfgOf(runB));
        final int n = signals.size();
        final int[] ia = new int[n], ib = new int[n];
        final String[] units = new String[n];
        final double[] res = new double[n];
        for (int k = 0; k < n; k++) {
            ia[k] = a.config().analogIndexOf(signals.get(k));
            ib[k] = b.config().analogIndexOf(signals.get(k));
            if (ia[k] < 0 || ib[k] < 0) {
                throw new IllegalArgumentException("signal '" + signals.get(k) + "' is not recorded in "
                        + (ia[k] < 0 ? runA : runB) + "; recorded: " + names(ia[k] < 0 ? a.config() : b.config()));
            }
            ComtradeConfig.AnalogChannel ch = a.config().analogChannels.get(ia[k]);
            units[k] = ch.unit();
            res[k] = Math.max(Math.abs(ch.a()), Math.abs(b.config().analogChannels.get(ib[k]).a()));
        }
        // B on its own thread, selected channels copied into the queue
        BlockingQueue<double[]> queue = new ArrayBlockingQueue<>(8192);
        Thread reader = new Thread(() -> {
            try {
                b.read((num, t, analog, status) -> {
                    double[] rec = new double[n + 1];
                    rec[0] = t;
                    for (int k = 0; k < n; k++) {
                        rec[k + 1] = analog[ib[k]];
                    }
                    put(queue, rec);
                });
            } catch (IOException e) {
                // reported as a shorter run B
            } finally {
                put(queue, END);
            }
        }, "galebench-compare-reader");
        reader.setDaemon(true);
        reader.start();

        final Acc[] acc = new Acc[n];
        for (int k = 0; k < n; k++) {
            acc[k] = new Acc(maxLagSamples);
        }
        final double[][] prevB = {null};
        final double[][] curB = {null};
        final boolean[] bDone = {false};
        final double[] endA = {0};
        final long[] countA = {0};
        a.read((num, t, analog, status) -> {
            countA[0]++;
            endA[0] = t;
            while (!bDone[0] && (curB[0] == null || curB[0][0] < t)) {
                prevB[0] = curB[0];
                double[] next = take(queue);
                if (next == END) {
                    bDone[0] = true;
                    break;
                }
                curB[0] = next;
            }
            if (curB[0] == null || (bDone[0] && curB[0][0] < t) || (prevB[0] == null && curB[0][0] > t)) {
                return;
            }
            double w = 0;
            double[] lo = curB[0];
            if (prevB[0] != null && curB[0][0] > t) {
                lo = prevB[0];
                w = (t - prevB[0][0]) / (curB[0][0] - prevB[0][0]);
            }
            for (int k = 0; k < n; k++) {
                double vb = lo[k + 1] + w * (curB[0][k + 1] - lo[k + 1]);
                acc[k].add(t, analog[ia[k]], vb);
            }
        });
        reader.interrupt();
        List<SignalDiff> out = new ArrayList<>();
        double duration = endA[0];
        for (int k = 0; k < n; k++) {
            String s = signals.get(k);
            Acc x = acc[k];
            double range = x.maxA - x.minA;
            double tol = tolerances.containsKey(s) ? tolerances.get(s)
                    : Math.max(defaultPercent / 100.0 * range, 2 * res[k]);
            double dt = countA[0] > 1 ? duration / (countA[0] - 1) : 0;
            double[][] plot = x.plot(duration);
            out.add(new SignalDiff(s, units[k], x.count, x.maxAbs, x.maxAt, Math.sqrt(x.sumSq / Math.max(1, x.count)),
                    x.bestLag() * dt, x.bestCorrelation(), res[k], tol, x.count > 0 && x.maxAbs <= tol,
                    plot[0], plot[1], plot[2]));
        }
        return out;
    }

    private static String names(ComtradeConfig c) {
        List<String> n = new ArrayList<>();
        for (ComtradeConfig.AnalogChannel ch : c.analogChannels) {
            n.add(ch.id());
        }
        return String.join(", ", n);
    }

    private static void put(BlockingQueue<double[]> q, double[] r) {
        try {
            q.put(r);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IllegalStateException(e);
        }
    }

    private static double[] take(BlockingQueue<double[]> q) {
        try {
            return q.take();
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            return END;
        }
    }

    /** Streaming statistics of one signal pair. */
    private static final class Acc {
        final int maxLag;
        long count;
        double maxAbs = 0, maxAt = Double.NaN, sumSq;
        double minA = Double.POSITIVE_INFINITY, maxA = Double.NEGATIVE_INFINITY;
        // cross-correlation sums per lag -maxLag..maxLag over the overlapping pairs (a[i], b[i + lag])
        final double[] ringA, ringB;
        final double[] pa, pb, paa, pbb, pab;
        final long[] pn;
        // min/max decimation for plots, in 0.25 s chunks grown as needed
        final List<double[]> buckets = new ArrayList<>();
        Acc(int maxLag) {
            this.maxLag = maxLag;
            final int l = 2 * maxLag + 1;
            ringA = new double[l];
            ringB = new double[l];
            pa = new double[l];
            pb = new double[l];
            paa = new double[l];
            pbb = new double[l];
            pab = new double[l];
            pn = new long[l];
        }

        void add(double t, double va, double vb) {
            if (Double.isNaN(va) || Double.isNaN(vb)) {
                return;
            }
            final double d = Math.abs(va - vb);
            if (d > maxAbs || Double.isNaN(maxAt)) {
                if (d >= maxAbs) {
                    maxAbs = d;
                    maxAt = t;
                }
            }
            sumSq += d * d;
            minA = Math.min(minA, va);
            maxA = Math.max(maxA, va);
            final int len = ringA.length;
            final int pos = (int) (count % len);
            ringA[pos] = va;
            ringB[pos] = vb;
            count++;
            // lag > 0 (B later than A): pair the newest b with the a 'lag' samples older;
            // lag < 0: pair the newest a with the b '|lag|' samples older
            for (int lag = 0; lag <= maxLag && lag < count; lag++) {
                final int older = (int) ((count - 1 - lag) % len);
                pair(maxLag + lag, ringA[older], vb);
                if (lag > 0) {
                    pair(maxLag - lag, va, ringB[older]);
                }
            }
            bucket(t, va, vb);
        }

        private void pair(int i, double x, double y) {
            pa[i] += x;
            pb[i] += y;
            paa[i] += x * x;
            pbb[i] += y * y;
            pab[i] += x * y;
            pn[i]++;
        }

        private void bucket(double t, double va, double vb) {
            double[] last = buckets.isEmpty() ? null : buckets.get(buckets.size() - 1);
            if (last == null || last[6] >= 64) {
                last = new double[] {t, va, va, vb, vb, t, 0};
                buckets.add(last);
            }
            last[1] = Math.min(last[1], va);
            last[2] = Math.max(last[2], va);
            last[3] = Math.min(last[3], vb);
            last[4] = Math.max(last[4], vb);
            last[5] = t;
            last[6]++;
            if (buckets.size() > 4 * PLOT_BUCKETS) {
                // merge pairs: keeps memory bounded for any run length
                List<double[]> merged = new ArrayList<>();
                for (int i = 0; i + 1 < buckets.size(); i += 2) {
                    double[] p = buckets.get(i), q = buckets.get(i + 1);
                    merged.add(new double[] {p[0], Math.min(p[1], q[1]), Math.max(p[2], q[2]), Math.min(p[3], q[3]),
                        Math.max(p[4], q[4]), q[5], 1e9});
                }
                if (buckets.size() % 2 == 1) {
                    merged.add(buckets.get(buckets.size() - 1));
                }
                buckets.clear();
                buckets.addAll(merged);
            }
        }

        /** Lag (in samples) maximising the Pearson correlation of the overlapping pairs; ties go to the smaller |lag|. */
        int bestLag() {
            int best = 0;
            double bestC = corr(maxLag);
            for (int lag = 1; lag <= maxLag; lag++) {
                for (int sign = 1; sign >= -1; sign -= 2) {
                    final double c = corr(maxLag + sign * lag);
                    if (c > bestC + 1e-12) {
                        bestC = c;
                        best = sign * lag;
                    }
                }
            }
            return best;
        }

        double bestCorrelation() {
            return corr(bestLag() + maxLag);
        }

        private double corr(int i) {
            final long m = pn[i];
            if (m < 2) {
                return Double.NEGATIVE_INFINITY;
            }
            final double ma = pa[i] / m, mb = pb[i] / m;
            final double va = paa[i] / m - ma * ma, vb = pbb[i] / m - mb * mb;
            final double floor = 1e-24 * (1 + ma * ma + mb * mb);
            if (va <= floor || vb <= floor) {
                return va <= floor && vb <= floor ? 1.0 : 0.0;
            }
            return Math.max(-1.0, Math.min(1.0, (pab[i] / m - ma * mb) / Math.sqrt(va * vb)));
        }

        /** t, A (min and max alternating), B (same), for a min/max envelope plot. */
        double[][] plot(double duration) {
            int m = buckets.size();
            double[] t = new double[2 * m], a = new double[2 * m], b = new double[2 * m];
            for (int i = 0; i < m; i++) {
                double[] q = buckets.get(i);
                t[2 * i] = q[0];
                t[2 * i + 1] = q[5];
                a[2 * i] = q[1];
                a[2 * i + 1] = q[2];
                b[2 * i] = q[3];
                b[2 * i + 1] = q[4];
            }
            return new double[][] {t, a, b};
        }
    }

    /** One line per signal for the terminal. */
    static String line(SignalDiff d) {
        return String.format(java.util.Locale.ROOT, "%s  %-22s max %s at %s, rms %s, lag %s (r = %.4f); tolerance %s",
                d.passed() ? "PASS" : "FAIL", d.signal(), Fmt.value(d.maxAbs(), d.unit()), Fmt.time(d.maxAtS()),
                Fmt.value(d.rms(), d.unit()), Fmt.duration(d.lagS()), d.correlation(), Fmt.value(d.tolerance(), d.unit()));
    }
}
