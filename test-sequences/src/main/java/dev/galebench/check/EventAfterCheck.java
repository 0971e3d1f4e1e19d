package dev.galebench.check;

import dev.galebench.report.CheckOutcome;

/**
 * An event happens within {@code withinS} after a trigger: e.g. the board's ride-through flag
 * after the start of a dip, or the watchdog trip after the board fell silent. The trigger is a
 * fixed time ({@code trigger == null}, {@code triggerAtS}) or the first time a condition holds at
 * or after {@code fromS}; the response is the first time its condition holds at or after the
 * trigger.
 */
public final class EventAfterCheck extends StreamingCheck {
    private final Condition trigger;
    private final Condition response;
    private final double fromS, withinS;
    private double triggerS;
    private double responseS = Double.NaN;
    private double lastS = Double.NaN;

    /**
     * @param trigger    condition, or null for a fixed trigger time
     * @param triggerAtS the fixed trigger time when {@code trigger} is null; otherwise where to
     *                   start looking for the trigger
     */
    public EventAfterCheck(String name, Condition trigger, double triggerAtS, Condition response, double withinS) {
        super(name, "event_after");
        this.trigger = trigger;
        this.response = response;
        this.fromS = triggerAtS;
        this.triggerS = trigger == null ? triggerAtS : Double.NaN;
        this.withinS = withinS;
    }

    @Override
    public String[] signals() {
        return trigger == null ? new String[] {response.signal()} : new String[] {trigger.signal(), response.signal()};
    }

    @Override
    public void bind(SignalIndex index) {
        if (trigger != null) {
            trigger.bind(index);
        }
        response.bind(index);
    }

    @Override
    public void onSample(double timeS, double[] values) {
        lastS = timeS;
        if (timeS < fromS || !Double.isNaN(responseS)) {
            return;
        }
        if (Double.isNaN(triggerS)) {
            if (trigger.holds(values)) {
                triggerS = timeS;
            } else {
                return;
            }
        }
        if (timeS >= triggerS && response.holds(values)) {
            responseS = timeS;
        }
    }

    private String triggerText() {
        return trigger == null ? Fmt.time(fromS) : "the first time " + trigger.describe() + " (from " + Fmt.time(fromS) + ")";
    }

    @Override
    public CheckOutcome finish(RunFacts facts) {
        String required = response.describe() + " within " + Fmt.duration(withinS) + " after " + triggerText();
        double end = Double.isNaN(triggerS) ? fromS : triggerS + withinS;
        if (Double.isNaN(triggerS)) {
            return outcome(false, "no trigger", required, "the trigger " + trigger.describe() + " never occurred",
                    trigger.signal(), fromS, Double.isNaN(lastS) ? fromS : lastS, Double.NaN, Double.NaN);
        }
        if (Double.isNaN(responseS)) {
            return outcome(false, "no response", required, response.describe() + " never happened after the trigger at "
                    + Fmt.time(triggerS) + " (run ended at " + Fmt.time(lastS) + ")", response.signal(), triggerS, end,
                    Double.NaN, Double.NaN);
        }
        final double delay = responseS - triggerS;
        String measured = Fmt.duration(delay);
        if (delay <= withinS) {
            return outcome(true, measured, required, "trigger at " + Fmt.time(triggerS) + ", response at "
                    + Fmt.time(responseS), response.signal(), triggerS, end, Double.NaN, Double.NaN);
        }
        return outcome(false, measured, required, response.describe() + " came " + Fmt.duration(delay - withinS)
                + " too late (trigger " + Fmt.time(triggerS) + ", response " + Fmt.time(responseS) + ")",
                response.signal(), triggerS, end, Double.NaN, Double.NaN);
    }
}
