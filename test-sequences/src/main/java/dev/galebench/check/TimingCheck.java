package dev.galebench.check;

import dev.galebench.report.CheckOutcome;

/**
 * Loop timing of a real-time run, judged from the loop's own HdrHistogram summary (every tick,
 * not only the recorded samples): tick lateness percentiles, overruns and board round trip.
 * Limits set to NaN are not judged. An offline run has no deadlines: the check then reports
 * "not applicable" and passes, saying so in its message.
 */
public final class TimingCheck extends StreamingCheck {
    private final double latenessP99MaxUs, latenessP999MaxUs, roundTripP99MaxUs;
    private final long overrunsMax;

    public TimingCheck(String name, double latenessP99MaxUs, double latenessP999MaxUs, double roundTripP99MaxUs,
                       long overrunsMax) {
        super(name, "timing");
        this.latenessP99MaxUs = latenessP99MaxUs;
        this.latenessP999MaxUs = latenessP999MaxUs;
        this.roundTripP99MaxUs = roundTripP99MaxUs;
        this.overrunsMax = overrunsMax;
    }

    @Override
    public String[] signals() {
        return new String[0];
    }

    @Override
    public void bind(SignalIndex index) {
        // judged from the loop's histograms, not from samples
    }

    @Override
    public void onSample(double timeS, double[] values) {
        // judged from the loop's histograms, not from samples
    }

    private String required() {
        StringBuilder b = new StringBuilder();
        if (!Double.isNaN(latenessP99MaxUs)) {
            b.append("lateness p99 <= ").append(Fmt.number(latenessP99MaxUs)).append(" us; ");
        }
        if (!Double.isNaN(latenessP999MaxUs)) {
            b.append("lateness p99.9 <= ").append(Fmt.number(latenessP999MaxUs)).append(" us; ");
        }
        if (!Double.isNaN(roundTripP99MaxUs)) {
            b.append("round trip p99 <= ").append(Fmt.number(roundTripP99MaxUs)).append(" us; ");
        }
        b.append("overruns <= ").append(overrunsMax);
        return b.toString();
    }

    @Override
    public CheckOutcome finish(RunFacts f) {
        if (!f.realTime) {
            return outcome(true, "not applicable", required(), "offline run: no deadlines, timing not judged", null,
                    Double.NaN, Double.NaN, Double.NaN, Double.NaN);
        }
        String measured = "lateness p99 " + Fmt.number(f.latenessP99Us) + " us, p99.9 " + Fmt.number(f.latenessP999Us)
                + " us, max " + Fmt.number(f.latenessMaxUs) + " us; round trip p99 " + Fmt.number(f.roundTripP99Us)
                + " us; overruns " + f.overruns + " of " + f.exchanges;
        StringBuilder bad = new StringBuilder();
        over(bad, "lateness p99", f.latenessP99Us, latenessP99MaxUs);
        over(bad, "lateness p99.9", f.latenessP999Us, latenessP999MaxUs);
        over(bad, "round trip p99", f.roundTripP99Us, roundTripP99MaxUs);
        if (f.overruns > overrunsMax) {
            bad.append(f.overruns).append(" overruns (limit ").append(overrunsMax).append("); ");
        }
        if (bad.length() == 0) {
            return outcome(true, measured, required(), "loop timing within limits", null, Double.NaN, Double.NaN,
                    Double.NaN, Double.NaN);
        }
        return outcome(false, measured, required(), "timing out of limits: " + bad.substring(0, bad.length() - 2),
                null, Double.NaN, Double.NaN, Double.NaN, Double.NaN);
    }

    private static void over(StringBuilder bad, String what, double measured, double limit) {
        if (Double.isNaN(limit)) {
            return;
        }
        if (Double.isNaN(measured)) {
            bad.append(what).append(" not measured; ");
        } else if (measured > limit) {
            bad.append(what).append(' ').append(Fmt.number(measured)).append(" us > ").append(Fmt.number(limit))
                    .append(" us; ");
        }
    }
}
