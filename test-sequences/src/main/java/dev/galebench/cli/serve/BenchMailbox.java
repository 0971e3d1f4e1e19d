package dev.galebench.cli.serve;

import dev.galebench.plant.PlantModel;
import dev.galebench.rt.StepHook;

/**
 * Hands interactive bench controls (wind, dip or swell, voltage-deviation reference, link
 * fault) from the console's control thread to the real-time thread, which applies them before
 * the next plant step. Why a mailbox and not a call: the plant belongs to the real-time
 * thread; touching it from another thread would race with the step.
 *
 * <p>How: the control thread writes the request's primitive fields, then increments the
 * volatile {@code posted} counter (release). The real-time thread reads {@code posted} once per
 * step (acquire; one plain load on x86) and, when it moved, applies every slot whose own
 * version moved. If a second request of the same kind lands while the first is being read,
 * the real-time thread may see the newer values a step early and apply them again when it sees
 * the newer version: both requests end in the state the last one asked for. One writer thread
 * only (the console's control thread).
 *
 * <p>Real-time cost: one volatile read per step; on a request, a few plant setter calls and one
 * volatile write. Allocates nothing, locks nothing (proven by {@code BenchMailboxTest}).
 */
public final class BenchMailbox implements StepHook {
    /** Switches a link fault on and off on the real-time thread; must allocate nothing. */
    public interface FaultSwitch {
        /** Starts fault {@code kind} (the switch's own numbering). */
        void begin(int kind);

        /** Ends the active fault. */
        void end();
    }

    private final FaultSwitch faults;

    // written by the control thread before 'posted' is incremented
    private double windMPerS;
    private int windVersion;
    private double voltageLevelPu;
    private long voltageDurationSteps;
    private int voltageVersion;
    private double deviationRefPu;
    private int deviationVersion;
    private int faultKind;
    private long faultDurationSteps;
    private int faultVersion;
    private volatile long posted;

    // real-time thread only
    private long seen;
    private int windApplied;
    private int voltageApplied;
    private int deviationApplied;
    private int faultApplied;
    private boolean voltageEventActive;
    private long voltageEndStep;
    private boolean faultActive;
    private long faultEndStep;
    private double baseVoltagePu = 1.0;

    /** Written by the real-time thread when it applied something; read by anyone. */
    private volatile long appliedCount;
    private volatile long lastAppliedStep = -1;

    /** @param faults where link faults go, or null if this bench has none */
    public BenchMailbox(FaultSwitch faults) {
        this.faults = faults;
    }

    /** Control thread: hub wind speed from the next step on. */
    public synchronized void postWind(double windMPerSValue) {
        windMPerS = windMPerSValue;
        windVersion++;
        posted = posted + 1;
    }

    /** Control thread: source magnitude to {@code levelPu} on all phases for {@code durationSteps}, then back. */
    public synchronized void postVoltageEvent(double levelPu, long durationSteps) {
        voltageLevelPu = levelPu;
        voltageDurationSteps = durationSteps;
        voltageVersion++;
        posted = posted + 1;
    }

    /** Control thread: the plant-level voltage-deviation reference. */
    public synchronized void postVoltageDeviationRef(double referencePu) {
        deviationRefPu = referencePu;
        deviationVersion++;
        posted = posted + 1;
    }

    /** Control thread: link fault {@code kind} for {@code durationSteps}. */
    public synchronized void postLinkFault(int kind, long durationSteps) {
        faultKind = kind;
        faultDurationSteps = durationSteps;
        faultVersion++;
        posted = posted + 1;
    }

    /** How many requests the real-time thread has applied so far. */
    public long appliedCount() {
        return appliedCount;
    }

    /** Step at which the last request took effect, -1 before any. */
    public long lastAppliedStep() {
        return lastAppliedStep;
    }

    @Override
    public void beforeStep(long stepIndex, PlantModel plant) {
        final long p = posted;
        if (p != seen) {
            seen = p;
            applyPosted(stepIndex, plant);
        }
        if (voltageEventActive && stepIndex >= voltageEndStep) {
            voltageEventActive = false;
            final double b = baseVoltagePu;
            plant.setGridVoltagePu(b, b, b);
        }
        if (faultActive && stepIndex >= faultEndStep) {
            faultActive = false;
            faults.end();
        }
    }

    private void applyPosted(long stepIndex, PlantModel plant) {
        int applied = 0;
        if (windVersion != windApplied) {
            windApplied = windVersion;
            plant.setWindSpeed(windMPerS);
            applied++;
        }
        if (voltageVersion != voltageApplied) {
            voltageApplied = voltageVersion;
            final double v = voltageLevelPu;
            plant.setGridVoltagePu(v, v, v);
            voltageEventActive = true;
            voltageEndStep = stepIndex + voltageDurationSteps;
            applied++;
        }
        if (deviationVersion != deviationApplied) {
            deviationApplied = deviationVersion;
            plant.setVoltageDeviationRefPu(deviationRefPu);
            applied++;
        }
        if (faultVersion != faultApplied) {
            faultApplied = faultVersion;
            if (faults != null) {
                if (faultActive) {
                    faults.end();
                }
                faults.begin(faultKind);
                faultActive = true;
                faultEndStep = stepIndex + faultDurationSteps;
                applied++;
            }
        }
        if (applied > 0) {
            lastAppliedStep = stepIndex;
            appliedCount = appliedCount + applied;
        }
    }
}
