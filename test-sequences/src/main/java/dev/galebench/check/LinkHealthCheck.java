package dev.galebench.check;

import dev.galebench.report.CheckOutcome;
import dev.galebench.rt.LinkCounters;

/**
 * Health of the board link over the run: missing replies, rejected frames (CRC, malformed,
 * invalid references), late replies and watchdog trips against limits, plus the largest reply
 * age seen in the {@code reply_age} signal (exchanges; 0 = on time). A negative limit is not
 * judged. {@code watchdogTripsExpected} >= 0 demands exactly that many watchdog trips (a
 * link-silence sequence expects 1).
 */
public final class LinkHealthCheck extends StreamingCheck {
    private static final String AGE = "reply_age";
    private final long missingMax, rejectedMax, lateMax, watchdogTripsExpected;
    private final double replyAgeMax;
    private int ageSlot = -1;
    private double maxAge;

    public LinkHealthCheck(String name, long missingMax, long rejectedMax, long lateMax, long watchdogTripsExpected,
                           double replyAgeMax) {
        super(name, "link_health");
        this.missingMax = missingMax;
        this.rejectedMax = rejectedMax;
        this.lateMax = lateMax;
        this.watchdogTripsExpected = watchdogTripsExpected;
        this.replyAgeMax = replyAgeMax;
    }

    @Override
    public String[] signals() {
        return Double.isNaN(replyAgeMax) ? new String[0] : new String[] {AGE};
    }

    @Override
    public void bind(SignalIndex index) {
        ageSlot = Double.isNaN(replyAgeMax) ? -1 : index.of(AGE);
    }

    @Override
    public void onSample(double timeS, double[] values) {
        if (ageSlot >= 0 && values[ageSlot] > maxAge) {
            maxAge = values[ageSlot];
        }
    }

    @Override
    public CheckOutcome finish(RunFacts f) {
        LinkCounters c = f.link;
        final long rejected = c.crcErrors + c.malformedFrames + c.invalidReferences;
        StringBuilder req = new StringBuilder();
        StringBuilder bad = new StringBuilder();
        limit(req, bad, "missing replies", c.missingReplies, missingMax);
        limit(req, bad, "rejected frames", rejected, rejectedMax);
        limit(req, bad, "late replies", c.lateReplies, lateMax);
        if (watchdogTripsExpected >= 0) {
            req.append("watchdog trips = ").append(watchdogTripsExpected).append("; ");
            if (c.watchdogTrips != watchdogTripsExpected) {
                bad.append("watchdog tripped ").append(c.watchdogTrips).append(" times, expected ")
                        .append(watchdogTripsExpected).append("; ");
            }
        }
        if (!Double.isNaN(replyAgeMax)) {
            req.append("reply age <= ").append(Fmt.number(replyAgeMax)).append("; ");
            if (maxAge > replyAgeMax) {
                bad.append("reply age reached ").append(Fmt.number(maxAge)).append(" exchanges; ");
            }
        }
        String measured = "sent " + c.framesSent + ", accepted " + c.repliesAccepted + ", missing " + c.missingReplies
                + ", rejected " + rejected + ", late " + c.lateReplies + ", stale " + c.staleReplies + ", duplicate "
                + c.duplicateReplies + ", watchdog trips " + c.watchdogTrips
                + (ageSlot >= 0 ? ", max reply age " + Fmt.number(maxAge) : "");
        String required = req.length() == 0 ? "(nothing judged)" : req.substring(0, req.length() - 2);
        if (bad.length() == 0) {
            return outcome(true, measured, required, "link healthy within the limits", ageSlot >= 0 ? AGE : null,
                    Double.NaN, Double.NaN, Double.NaN, replyAgeMax);
        }
        return outcome(false, measured, required, "link out of limits: " + bad.substring(0, bad.length() - 2),
                ageSlot >= 0 ? AGE : null, Double.NaN, Double.NaN, Double.NaN, replyAgeMax);
    }

    private static void limit(StringBuilder req, StringBuilder bad, String what, long value, long max) {
        if (max < 0) {
            return;
        }
        req.append(what).append(" <= ").append(max).append("; ");
        if (value > max) {
            bad.append(what).append(' ').append(value).append(" > ").append(max).append("; ");
        }
    }
}
