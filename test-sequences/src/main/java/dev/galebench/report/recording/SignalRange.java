package dev.galebench.report.recording;

/**
 * The range a recorded analog signal is expected to stay in, in the signal's own unit. A
 * COMTRADE channel maps this range linearly onto the 16-bit sample codes -32767..32767, so the
 * resolution of a channel is {@code (maxValue - minValue) / 65534}; values outside are clamped
 * to the nearest limit and counted (see {@link ComtradeRecorder#clampedSampleCount(int)}).
 *
 * @param minValue lowest value expected, signal unit
 * @param maxValue highest value expected, signal unit; must be greater than {@code minValue}
 * @param source   where the range came from, for the reports (e.g. {@code "rated 1.5 x gsc trip"})
 */
public record SignalRange(double minValue, double maxValue, String source) {
    public SignalRange {
        if (!(maxValue > minValue) || Double.isInfinite(minValue) || Double.isInfinite(maxValue)) {
            throw new IllegalArgumentException("signal range needs finite min < max, got [" + minValue + ", " + maxValue + "]");
        }
    }

    /** A range symmetric about zero, {@code [-limit, +limit]}. */
    public static SignalRange symmetric(double limit, String source) {
        return new SignalRange(-limit, limit, source);
    }
}
