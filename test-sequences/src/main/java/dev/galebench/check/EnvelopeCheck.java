package dev.galebench.check;

import dev.galebench.plant.SensorView;
import dev.galebench.report.CheckOutcome;

/**
 * Fault ride-through against a voltage-time profile: while the measured voltage stays at or
 * above the profile, the unit must stay connected (no latched plant trip, breaker closed, and,
 * unless {@code gatingRequired} is false, the grid-side converter not blocked). Once the voltage
 * has fallen below the profile, the grid code allows disconnection and the check stops judging.
 *
 * <p>The profile is given as points {@code (t, v)} relative to {@code atS} (the fault start),
 * joined linearly; two points at the same time make a vertical step (the later point applies
 * from that time on). Typical profiles: EU 2016/631 (RfG) Table 3.2 for power park modules,
 * NERC PRC-024 (see the library and REFERENCES.md section 6).
 */
public final class EnvelopeCheck extends StreamingCheck {
    private static final String TRIPS = "trip_flags";
    private static final String STATUS = "status_flags";
    private final String voltageSignal;
    private final double atS;
    private final double[] pointS, pointPu;
    private final boolean gatingRequired;
    private int vSlot, tripSlot, statusSlot;
    private long count;
    private double belowS = Double.NaN, belowV = Double.NaN;
    private double disconnectedS = Double.NaN, disconnectedV = Double.NaN, disconnectedProfile = Double.NaN;
    private String disconnectedWhy;
    private double minMargin = Double.POSITIVE_INFINITY, minMarginS = Double.NaN;

    public EnvelopeCheck(String name, String voltageSignal, double atS, double[] pointS, double[] pointPu,
                         boolean gatingRequired) {
        super(name, "envelope");
        this.voltageSignal = voltageSignal;
        this.atS = atS;
        this.pointS = pointS.clone();
        this.pointPu = pointPu.clone();
        this.gatingRequired = gatingRequired;
    }

    @Override
    public String[] signals() {
        return new String[] {voltageSignal, TRIPS, STATUS};
    }

    @Override
    public void bind(SignalIndex index) {
        vSlot = index.of(voltageSignal);
        tripSlot = index.of(TRIPS);
        statusSlot = index.of(STATUS);
    }

    /** Profile value at {@code rel} s after the fault start. */
    double profileAt(double rel) {
        final int n = pointS.length;
        if (rel <= pointS[0]) {
            return pointPu[0];
        }
        for (int i = n - 1; i >= 0; i--) {
            if (rel >= pointS[i]) {
                if (i == n - 1 || pointS[i + 1] == pointS[i]) {
                    return pointPu[i];
                }
                return pointPu[i] + (pointPu[i + 1] - pointPu[i]) * (rel - pointS[i]) / (pointS[i + 1] - pointS[i]);
            }
        }
        return pointPu[0];
    }

    @Override
    public void onSample(double timeS, double[] values) {
        final double rel = timeS - atS;
        if (rel < 0 || rel > pointS[pointS.length - 1] || !Double.isNaN(belowS) || !Double.isNaN(disconnectedS)) {
            return;
        }
        count++;
        final double v = values[vSlot];
        final double p = profileAt(rel);
        if (v < p) {
            belowS = timeS;
            belowV = v;
            return;
        }
        if (v - p < minMargin) {
            minMargin = v - p;
            minMarginS = timeS;
        }
        final int trips = (int) values[tripSlot];
        final int status = (int) values[statusSlot];
        String why = null;
        if (trips != 0) {
            why = "trip flags 0x" + Integer.toHexString(trips);
        } else if ((status & SensorView.STATUS_BREAKER_CLOSED) == 0) {
            why = "breaker open";
        } else if (gatingRequired && (status & SensorView.STATUS_GSC_BLOCKED) != 0) {
            why = "grid-side converter blocked";
        }
        if (why != null) {
            disconnectedS = timeS;
            disconnectedV = v;
            disconnectedProfile = p;
            disconnectedWhy = why;
        }
    }

    @Override
    public CheckOutcome finish(RunFacts facts) {
        final double endS = atS + pointS[pointS.length - 1];
        StringBuilder prof = new StringBuilder();
        for (int i = 0; i < pointS.length; i++) {
            prof.append(i == 0 ? "" : ", ").append('(').append(Fmt.number(pointS[i])).append(" s, ")
                    .append(Fmt.number(pointPu[i])).append(')');
        }
        String required = "connected while " + voltageSignal + " >= profile " + prof + " pu after " + Fmt.time(atS);
        if (count == 0) {
            return outcome(false, "no samples", required, "no sample in the profile window", voltageSignal, atS, endS,
                    Double.NaN, Double.NaN);
        }
        if (!Double.isNaN(disconnectedS)) {
            return outcome(false, "disconnected at " + Fmt.time(disconnectedS), required, "the unit disconnected ("
                    + disconnectedWhy + ") at " + Fmt.time(disconnectedS) + " while " + voltageSignal + " was "
                    + Fmt.value(disconnectedV, "pu") + ", above the profile's " + Fmt.value(disconnectedProfile, "pu"),
                    voltageSignal, atS, endS, Double.NaN, Double.NaN);
        }
        String measured = "connected; smallest margin " + Fmt.value(minMargin, "pu") + " at " + Fmt.time(minMarginS);
        if (!Double.isNaN(belowS)) {
            return outcome(true, measured, required, voltageSignal + " fell below the profile at " + Fmt.time(belowS)
                    + " (" + Fmt.value(belowV, "pu") + "); disconnection was permitted from then on",
                    voltageSignal, atS, endS, Double.NaN, Double.NaN);
        }
        return outcome(true, measured, required, "stayed connected through the whole profile", voltageSignal, atS,
                endS, Double.NaN, Double.NaN);
    }
}
