package dev.galebench.check;

import dev.galebench.report.CheckOutcome;

/**
 * Reactive-current injection during a voltage dip per the k-factor rule
 * {@code delta i_q / I_N = k * delta U / U_N} (German grid codes: TransmissionCode 2007 and
 * VDE-AR-N 4110/4120, from memory; see REFERENCES.md 6c). The pre-fault voltage and reactive
 * current are the means over {@code [atS - preS, atS)}. From {@code atS + delayS} to
 * {@code untilS}, every sample must satisfy
 * {@code -tolLowPu <= i_q - expected <= tolHighPu}, with
 * {@code expected = i_q,pre + k * max(0, |dU| - deadband) * sign(dU)}, clipped to
 * {@code +/- maxPu}, where {@code dU = U_pre - U} (positive in a dip: capacitive injection).
 *
 * <p>Currents are judged in pu of the grid code's rated current I_N: the current signal is
 * divided by {@code ratedCurrentPu}, I_N expressed in the signal's own pu (1 when the signal is
 * already in pu of I_N). Tolerances and the limit are in pu of I_N.
 */
public final class ReactiveCurrentCheck extends StreamingCheck {
    private final String voltageSignal, currentSignal;
    private final double atS, untilS, k, delayS, tolLowPu, tolHighPu, deadbandPu, maxPu, preS, ratedCurrentPu;
    private int vSlot, iSlot;
    private double sumV, sumI;
    private long preCount, count;
    private double worstErr, worstS = Double.NaN, worstExpected = Double.NaN, worstMeasured = Double.NaN;
    private boolean failed;
    private double firstFailS = Double.NaN;
    private double sumExpected;

    public ReactiveCurrentCheck(String name, String voltageSignal, String currentSignal, double atS, double untilS,
                                double k, double delayS, double tolLowPu, double tolHighPu, double deadbandPu,
                                double maxPu, double preS, double ratedCurrentPu) {
        super(name, "reactive_current");
        this.voltageSignal = voltageSignal;
        this.currentSignal = currentSignal;
        this.atS = atS;
        this.untilS = untilS;
        this.k = k;
        this.delayS = delayS;
        this.tolLowPu = tolLowPu;
        this.tolHighPu = tolHighPu;
        this.deadbandPu = deadbandPu;
        this.maxPu = maxPu;
        this.preS = preS;
        this.ratedCurrentPu = ratedCurrentPu;
    }

    @Override
    public String[] signals() {
        return new String[] {voltageSignal, currentSignal};
    }

    @Override
    public void bind(SignalIndex index) {
        vSlot = index.of(voltageSignal);
        iSlot = index.of(currentSignal);
    }

    /** Expected reactive current for a voltage {@code v}, given the pre-fault means. */
    double expected(double v, double vPre, double iPre) {
        final double du = vPre - v;
        final double mag = Math.max(0.0, Math.abs(du) - deadbandPu);
        final double e = iPre + k * Math.signum(du) * mag;
        return Math.max(-maxPu, Math.min(maxPu, e));
    }

    @Override
    public void onSample(double timeS, double[] values) {
        if (timeS >= atS - preS && timeS < atS) {
            sumV += values[vSlot];
            sumI += values[iSlot] / ratedCurrentPu;
            preCount++;
            return;
        }
        if (timeS < atS + delayS || timeS > untilS || preCount == 0) {
            return;
        }
        final double vPre = sumV / preCount, iPre = sumI / preCount;
        final double exp = expected(values[vSlot], vPre, iPre);
        final double iq = values[iSlot] / ratedCurrentPu;
        final double err = iq - exp;
        count++;
        sumExpected += exp;
        final boolean bad = err < -tolLowPu || err > tolHighPu || Double.isNaN(iq);
        final double severity = err < 0 ? -err / tolLowPu : err / tolHighPu;
        if (bad && !failed) {
            failed = true;
            firstFailS = timeS;
        }
        if (Double.isNaN(worstS) || severity > worstErr || Double.isNaN(iq)) {
            worstErr = Double.isNaN(iq) ? Double.POSITIVE_INFINITY : severity;
            worstS = timeS;
            worstExpected = exp;
            worstMeasured = iq;
        }
    }

    @Override
    public CheckOutcome finish(RunFacts facts) {
        final double from = atS + delayS;
        String required = currentSignal + " within -" + Fmt.number(tolLowPu) + "/+" + Fmt.number(tolHighPu)
                + " pu of k*dU (k = " + Fmt.number(k) + (deadbandPu > 0 ? ", dead band " + Fmt.number(deadbandPu) + " pu" : "")
                + ", limit " + Fmt.number(maxPu) + " pu" + (ratedCurrentPu != 1.0 ? ", pu of I_N = "
                + Fmt.number(ratedCurrentPu) + " pu of the signal" : "") + ") from " + Fmt.duration(delayS) + " after " + Fmt.time(atS)
                + " to " + Fmt.time(untilS);
        if (preCount == 0 || count == 0) {
            return outcome(false, "no samples", required, preCount == 0 ? "no pre-fault samples before "
                    + Fmt.time(atS) : "no samples in the judged window", currentSignal, from, untilS, Double.NaN, Double.NaN);
        }
        final double meanExp = sumExpected / count;
        final double lo = meanExp - tolLowPu, hi = meanExp + tolHighPu;
        String measured = "worst " + Fmt.value(worstMeasured, "pu") + " vs expected " + Fmt.value(worstExpected, "pu")
                + " at " + Fmt.time(worstS);
        if (!failed) {
            return outcome(true, measured, required, "reactive current followed k*dU (pre-fault U "
                    + Fmt.value(sumV / preCount, "pu") + ", i_q " + Fmt.value(sumI / preCount, "pu") + ")",
                    currentSignal, from, untilS, lo, hi);
        }
        return outcome(false, measured, required, currentSignal + " left the tolerance at " + Fmt.time(firstFailS)
                + "; worst: measured " + Fmt.value(worstMeasured, "pu") + ", expected "
                + Fmt.value(worstExpected, "pu") + " (deviation " + Fmt.value(worstMeasured - worstExpected, "pu")
                + ")", currentSignal, from, untilS, lo, hi);
    }
}
