package dev.galebench.check;

import dev.galebench.report.CheckOutcome;

/**
 * Overshoot of a step response: the largest excursion beyond {@code final} in the direction of
 * the step, in % of the step size (common definition), over {@code (atS, toS]}. {@code initial}
 * NaN means the last sample at or before {@code atS}.
 */
public final class OvershootCheck extends SingleSignalCheck {
    private final double atS, initialGiven, finalValue, maxPercent, toS;
    private double initial = Double.NaN;
    private double peakBeyond = 0, peakS = Double.NaN, peakValue = Double.NaN;
    private long count;

    public OvershootCheck(String name, String signal, double atS, double initial, double finalValue,
                          double maxPercent, double toS) {
        super(name, "overshoot", signal);
        this.atS = atS;
        this.initialGiven = initial;
        this.initial = initial;
        this.finalValue = finalValue;
        this.maxPercent = maxPercent;
        this.toS = toS;
    }



    @Override
    public void onSample(double timeS, double[] values) {
        final double v = values[slot];
        if (timeS <= atS) {
            if (Double.isNaN(initialGiven)) {
                initial = v;
            }
            return;
        }
        if (timeS > toS || Double.isNaN(initial)) {
            return;
        }
        count++;
        final double direction = Math.signum(finalValue - initial);
        final double beyond = (v - finalValue) * direction;
        if (beyond > peakBeyond || Double.isNaN(v)) {
            peakBeyond = Double.isNaN(v) ? Double.POSITIVE_INFINITY : beyond;
            peakS = timeS;
            peakValue = v;
        }
    }

    @Override
    public CheckOutcome finish(RunFacts facts) {
        final double step = Math.abs(finalValue - initial);
        String required = "<= " + Fmt.number(maxPercent) + " % of the step " + Fmt.number(initial) + " -> "
                + Fmt.value(finalValue, unit);
        final double band = step * maxPercent / 100.0;
        final double dir = Math.signum(finalValue - initial);
        double lo = dir >= 0 ? Double.NaN : finalValue - band, hi = dir >= 0 ? finalValue + band : Double.NaN;
        if (count == 0 || step == 0) {
            return outcome(false, "no samples", required, count == 0 ? "no sample of " + signal + " after "
                    + Fmt.time(atS) : "the step size is zero", signal, atS, toS, lo, hi);
        }
        final double percent = 100.0 * peakBeyond / step;
        String measured = Fmt.number(percent) + " %";
        if (percent <= maxPercent) {
            return outcome(true, measured, required, Double.isNaN(peakS) ? signal + " never went beyond the final value"
                    : "peak " + Fmt.value(peakValue, unit) + " at " + Fmt.time(peakS), signal, atS, toS, lo, hi);
        }
        return outcome(false, measured, required, signal + " overshot to " + Fmt.value(peakValue, unit) + " at "
                + Fmt.time(peakS), signal, atS, toS, lo, hi);
    }
}
