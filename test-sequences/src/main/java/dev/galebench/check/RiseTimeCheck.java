package dev.galebench.check;

import dev.galebench.report.CheckOutcome;

/**
 * 10-90 % rise time of a step response (common definition, IEC 61400-21-1 usage, from memory):
 * the time between the first crossings of 10 % and 90 % of the change from {@code initial} to
 * {@code final}, after the step at {@code atS}. {@code initial} NaN means "the value of the last
 * sample at or before {@code atS}". Crossing times are interpolated linearly between samples,
 * so the resolution is finer than one exchange for smooth signals.
 */
public final class RiseTimeCheck extends SingleSignalCheck {
    private final double atS, initialGiven, finalValue, maxS, toS;
    private double initial = Double.NaN;
    private double prevS = Double.NaN, prevFraction = Double.NaN;
    private double t10 = Double.NaN, t90 = Double.NaN;
    private boolean any;

    public RiseTimeCheck(String name, String signal, double atS, double initial, double finalValue, double maxS,
                         double toS) {
        super(name, "rise_time", signal);
        this.atS = atS;
        this.initialGiven = initial;
        this.initial = initial;
        this.finalValue = finalValue;
        this.maxS = maxS;
        this.toS = toS;
    }



    @Override
    public void onSample(double timeS, double[] values) {
        final double v = values[slot];
        if (timeS <= atS) {
            if (Double.isNaN(initialGiven)) {
                initial = v;
            }
            prevS = timeS;
            prevFraction = Double.NaN;
            return;
        }
        if (timeS > toS || Double.isNaN(initial)) {
            return;
        }
        any = true;
        final double fraction = (v - initial) / (finalValue - initial);
        if (Double.isNaN(t10) && fraction >= 0.1) {
            t10 = cross(timeS, fraction, 0.1);
        }
        if (Double.isNaN(t90) && fraction >= 0.9) {
            t90 = cross(timeS, fraction, 0.9);
        }
        prevS = timeS;
        prevFraction = fraction;
    }

    private double cross(double timeS, double fraction, double level) {
        if (Double.isNaN(prevFraction) || prevFraction >= level) {
            return timeS;
        }
        return prevS + (timeS - prevS) * (level - prevFraction) / (fraction - prevFraction);
    }

    @Override
    public CheckOutcome finish(RunFacts facts) {
        String required = "<= " + Fmt.duration(maxS) + " (10-90 % of " + Fmt.number(initial) + " -> "
                + Fmt.value(finalValue, unit) + ")";
        double lo = Math.min(initial, finalValue), hi = Math.max(initial, finalValue);
        if (!any) {
            return outcome(false, "no samples", required, "no sample of " + signal + " after the step at "
                    + Fmt.time(atS), signal, atS, toS, lo, hi);
        }
        if (Double.isNaN(t90)) {
            return outcome(false, "not reached", required, signal + " did not reach 90 % of the change by "
                    + Fmt.time(toS) + (Double.isNaN(t10) ? " (not even 10 %)" : ""), signal, atS, toS, lo, hi);
        }
        final double rise = t90 - t10;
        String measured = Fmt.duration(rise);
        String where = "10 % at " + Fmt.time(t10) + ", 90 % at " + Fmt.time(t90);
        if (rise <= maxS) {
            return outcome(true, measured, required, where, signal, atS, toS, lo, hi);
        }
        return outcome(false, measured, required, signal + " rose too slowly: " + where + ", "
                + Fmt.duration(rise - maxS) + " over the limit", signal, atS, toS, lo, hi);
    }
}
