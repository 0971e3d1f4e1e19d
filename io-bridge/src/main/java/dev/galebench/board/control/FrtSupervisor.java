package dev.galebench.board.control;

/**
 * Fault ride-through detection with hysteresis and a hold time. The deviation is the terminal
 * voltage minus the pre-fault reference (both pu). FRT starts when |deviation| exceeds the entry
 * threshold; it ends when |deviation| has stayed below the (lower) exit threshold for the hold
 * time. Why a hold: the converter's own reactive current lifts the terminal voltage, so
 * without it a shallow dip would switch FRT on and off at the loop's rate (REFERENCES.md 6c:
 * TransmissionCode 2007 keeps support for a further time after the voltage is back, from
 * memory; common practice 0.1-0.5 s).
 */
public final class FrtSupervisor {
    private double enterPu;
    private double exitPu;
    private double holdS;
    private boolean active;
    private double belowTimerS;
    private double activeTimeS;

    public void configure(double enterPu, double exitPu, double holdS) {
        this.enterPu = enterPu;
        this.exitPu = exitPu;
        this.holdS = holdS;
        reset();
    }

    public void reset() {
        active = false;
        belowTimerS = 0.0;
        activeTimeS = 0.0;
    }

    /** One sample; returns whether FRT is active after it. */
    public boolean step(double deviationPu, double samplePeriodS) {
        final double mag = Math.abs(deviationPu);
        if (!active) {
            if (mag > enterPu) {
                active = true;
                belowTimerS = 0.0;
                activeTimeS = 0.0;
            }
        } else {
            activeTimeS += samplePeriodS;
            if (mag < exitPu) {
                belowTimerS += samplePeriodS;
                if (belowTimerS >= holdS) {
                    active = false;
                }
            } else {
                belowTimerS = 0.0;
            }
        }
        return active;
    }

    public boolean active() {
        return active;
    }

    /** Time since FRT became active, s (0 when inactive). */
    public double activeTimeS() {
        return active ? activeTimeS : 0.0;
    }
}
