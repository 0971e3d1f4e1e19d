package dev.galebench.report.plot;

import java.util.Arrays;

/**
 * Min/max decimation of an in-memory series: cut into buckets of consecutive points, keep each
 * bucket's smallest and largest value in the order they occurred. Unlike averaging or picking
 * every n-th point, a one-sample spike survives, which is what a reviewer looks for in a fault
 * recording. NaN points are skipped.
 */
public final class MinMaxDecimation {
    private MinMaxDecimation() {
    }

    /** Result: x and y of the kept points. */
    public record Points(double[] x, double[] y) {
    }

    /** Keeps at most about {@code maxPoints} points (two per bucket); returns the input if already small enough. */
    public static Points decimate(double[] x, double[] y, int maxPoints) {
        if (x.length != y.length) {
            throw new IllegalArgumentException("x and y differ in length: " + x.length + " vs " + y.length);
        }
        if (x.length <= maxPoints) {
            return new Points(x, y);
        }
        int buckets = Math.max(1, maxPoints / 2);
        int per = (x.length + buckets - 1) / buckets;
        double[] ox = new double[2 * buckets];
        double[] oy = new double[2 * buckets];
        int n = 0;
        for (int start = 0; start < x.length; start += per) {
            int end = Math.min(x.length, start + per);
            int iMin = -1;
            int iMax = -1;
            for (int i = start; i < end; i++) {
                if (Double.isNaN(y[i])) {
                    continue;
                }
                if (iMin < 0 || y[i] < y[iMin]) {
                    iMin = i;
                }
                if (iMax < 0 || y[i] > y[iMax]) {
                    iMax = i;
                }
            }
            if (iMin < 0) {
                continue;
            }
            int first = Math.min(iMin, iMax);
            int second = Math.max(iMin, iMax);
            ox[n] = x[first];
            oy[n++] = y[first];
            if (second != first) {
                ox[n] = x[second];
                oy[n++] = y[second];
            }
        }
        return new Points(Arrays.copyOf(ox, n), Arrays.copyOf(oy, n));
    }
}
