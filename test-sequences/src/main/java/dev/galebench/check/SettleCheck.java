package dev.galebench.check;

import dev.galebench.report.CheckOutcome;

/**
 * After {@code afterS} (typically a step), a signal enters {@code target +/- tolerance} no
 * later than {@code byS} and stays inside until {@code toS}. The settling time is measured as
 * the common definition (VDE-AR-N 4110 "Einschwingzeit", IEC 61400-21-1 usage, from memory):
 * from {@code afterS} to the start of the last in-band stretch that lasts to the window end.
 * {@code target} NaN means "back to where it was": the mean of the signal over
 * {@code [afterS - preS, afterS)}.
 */
public final class SettleCheck extends SingleSignalCheck {
    private final double tolerance, afterS, byS, toS, preS;
    private double target;
    private double preSum;
    private long preCount;
    private long count;
    private double enteredS = Double.NaN;
    private double lastS = Double.NaN, lastValue = Double.NaN;

    public SettleCheck(String name, String signal, double target, double tolerance, double afterS, double byS,
                       double toS, double preS) {
        super(name, "settle", signal);
        this.target = target;
        this.tolerance = tolerance;
        this.afterS = afterS;
        this.byS = byS;
        this.toS = toS;
        this.preS = preS;
    }



    @Override
    public void onSample(double timeS, double[] values) {
        final double v = values[slot];
        if (timeS < afterS) {
            if (timeS >= afterS - preS) {
                preSum += v;
                preCount++;
            }
            return;
        }
        if (timeS > toS) {
            return;
        }
        if (count == 0 && Double.isNaN(target)) {
            target = preCount == 0 ? Double.NaN : preSum / preCount;
        }
        count++;
        final boolean inside = Math.abs(v - target) <= tolerance;
        if (inside) {
            if (Double.isNaN(enteredS)) {
                enteredS = timeS;
            }
        } else {
            enteredS = Double.NaN;
        }
        lastS = timeS;
        lastValue = v;
    }

    @Override
    public CheckOutcome finish(RunFacts facts) {
        final double limit = byS - afterS;
        String required = Fmt.value(target, unit) + " +/- " + Fmt.value(tolerance, unit) + " within "
                + Fmt.duration(limit) + " after " + Fmt.time(afterS) + ", held to " + Fmt.time(toS);
        double lo = target - tolerance, hi = target + tolerance;
        if (count == 0) {
            return outcome(false, "no samples", required, "no sample of " + signal + " after " + Fmt.time(afterS),
                    signal, afterS, toS, lo, hi);
        }
        if (Double.isNaN(enteredS)) {
            return outcome(false, "not settled", required, signal + " was still outside the band at "
                    + Fmt.time(lastS) + " (" + Fmt.value(lastValue, unit) + ")", signal, afterS, toS, lo, hi);
        }
        final double settling = enteredS - afterS;
        String measured = Fmt.duration(settling);
        if (enteredS <= byS) {
            return outcome(true, measured, required, signal + " settled at " + Fmt.time(enteredS)
                    + " and stayed in the band", signal, afterS, toS, lo, hi);
        }
        return outcome(false, measured, required, signal + " settled only at " + Fmt.time(enteredS) + ", "
                + Fmt.duration(enteredS - byS) + " too late", signal, afterS, toS, lo, hi);
    }
}
