package dev.galebench.check;

import dev.galebench.report.CheckOutcome;

/**
 * A signal stays within {@code [low, high]} over the window {@code [fromS, toS]}. Either limit
 * may be NaN (one-sided band). Keeps the extremes, the first excursion and the worst excursion.
 */
public final class BandCheck extends SingleSignalCheck {
    private final double low, high, fromS, toS;
    private long count, outside;
    private double min = Double.POSITIVE_INFINITY, max = Double.NEGATIVE_INFINITY;
    private double firstOutS = Double.NaN, firstOutValue = Double.NaN;
    private double worstExcess, worstS = Double.NaN, worstValue = Double.NaN;

    public BandCheck(String name, String signal, double low, double high, double fromS, double toS) {
        super(name, "band", signal);
        this.low = low;
        this.high = high;
        this.fromS = fromS;
        this.toS = toS;
    }



    @Override
    public void onSample(double timeS, double[] values) {
        if (timeS < fromS || timeS > toS) {
            return;
        }
        final double v = values[slot];
        count++;
        if (v < min) {
            min = v;
        }
        if (v > max) {
            max = v;
        }
        final double excess = excess(v);
        if (excess > 0 || Double.isNaN(v)) {
            outside++;
            if (Double.isNaN(firstOutS)) {
                firstOutS = timeS;
                firstOutValue = v;
            }
            if (excess > worstExcess || Double.isNaN(v)) {
                worstExcess = Double.isNaN(v) ? Double.POSITIVE_INFINITY : excess;
                worstS = timeS;
                worstValue = v;
            }
        }
    }

    private double excess(double v) {
        double e = 0;
        if (!Double.isNaN(low) && v < low) {
            e = low - v;
        }
        if (!Double.isNaN(high) && v > high) {
            e = Math.max(e, v - high);
        }
        return e;
    }

    private String requiredText() {
        if (Double.isNaN(low)) {
            return "<= " + Fmt.value(high, unit);
        }
        if (Double.isNaN(high)) {
            return ">= " + Fmt.value(low, unit);
        }
        return "within " + Fmt.number(low) + " .. " + Fmt.value(high, unit);
    }

    @Override
    public CheckOutcome finish(RunFacts facts) {
        String required = requiredText() + " from " + Fmt.time(fromS) + " to " + Fmt.time(toS);
        if (count == 0) {
            return outcome(false, "no samples", required, "no sample of " + signal + " fell in the window"
                    + (facts.aborted ? " (the run was aborted: " + facts.abortReason + ")" : ""),
                    signal, fromS, toS, low, high);
        }
        String measured = "min " + Fmt.value(min, unit) + ", max " + Fmt.value(max, unit);
        if (outside == 0) {
            return outcome(true, measured, required, signal + " stayed " + requiredText() + " over " + count
                    + " samples", signal, fromS, toS, low, high);
        }
        return outcome(false, measured, required, signal + " left the band at " + Fmt.time(firstOutS) + " ("
                + Fmt.value(firstOutValue, unit) + "); worst " + Fmt.value(worstValue, unit) + " at "
                + Fmt.time(worstS) + ", " + outside + " of " + count + " samples outside", signal, fromS, toS, low, high);
    }
}
