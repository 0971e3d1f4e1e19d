package dev.galebench.check;

import dev.galebench.report.CheckOutcome;

/**
 * Active power recovers after a fault: after the voltage is back ({@code clearedAtS}), the
 * signal (default {@code p_grid_pu}) reaches {@code fraction} of its pre-fault mean (over
 * {@code [faultAtS - preS, faultAtS)}) within {@code withinS}. Grid codes state such a recovery
 * as a time or a ramp rate (e.g. "90 % within 0.5 s", common practice).
 */
public final class PowerRecoveryCheck extends SingleSignalCheck {
    private final double faultAtS, clearedAtS, withinS, fraction, preS;
    private double sum;
    private long preCount;
    private double recoveredS = Double.NaN;
    private double lastS = Double.NaN, lastV = Double.NaN;

    public PowerRecoveryCheck(String name, String signal, double faultAtS, double clearedAtS, double withinS,
                              double fraction, double preS) {
        super(name, "power_recovery", signal);
        this.faultAtS = faultAtS;
        this.clearedAtS = clearedAtS;
        this.withinS = withinS;
        this.fraction = fraction;
        this.preS = preS;
    }



    @Override
    public void onSample(double timeS, double[] values) {
        final double v = values[slot];
        if (timeS >= faultAtS - preS && timeS < faultAtS) {
            sum += v;
            preCount++;
            return;
        }
        if (timeS < clearedAtS || !Double.isNaN(recoveredS) || preCount == 0) {
            return;
        }
        lastS = timeS;
        lastV = v;
        if (v >= fraction * (sum / preCount)) {
            recoveredS = timeS;
        }
    }

    @Override
    public CheckOutcome finish(RunFacts facts) {
        final double pre = preCount == 0 ? Double.NaN : sum / preCount;
        final double target = fraction * pre;
        String required = ">= " + Fmt.number(fraction * 100) + " % of pre-fault " + Fmt.value(pre, "pu") + " within "
                + Fmt.duration(withinS) + " after " + Fmt.time(clearedAtS);
        final double end = clearedAtS + withinS;
        if (preCount == 0) {
            return outcome(false, "no samples", required, "no pre-fault samples before " + Fmt.time(faultAtS),
                    signal, clearedAtS, end, Double.NaN, Double.NaN);
        }
        if (Double.isNaN(recoveredS)) {
            return outcome(false, "not recovered", required, signal + " had not recovered to " + Fmt.value(target, "pu")
                    + " by the end of the run (" + Fmt.value(lastV, "pu") + " at " + Fmt.time(lastS) + ")",
                    signal, clearedAtS, end, target, Double.NaN);
        }
        final double t = recoveredS - clearedAtS;
        String measured = Fmt.duration(t);
        if (t <= withinS) {
            return outcome(true, measured, required, signal + " reached " + Fmt.value(target, "pu") + " at "
                    + Fmt.time(recoveredS), signal, clearedAtS, end, target, Double.NaN);
        }
        return outcome(false, measured, required, signal + " recovered " + Fmt.duration(t - withinS) + " too late, at "
                + Fmt.time(recoveredS), signal, clearedAtS, end, target, Double.NaN);
    }
}
