package dev.galebench.board;

import dev.galebench.plant.BoardCommand;
import dev.galebench.plant.SensorView;

/**
 * The simplest honest board: it controls nothing. Both converters stay blocked (gates off,
 * duties 0.5, chopper off), the grid breaker is kept in the state the first measurement
 * reports, and the pitch reference holds the first measured pitch angle. Board status 0
 * (not running). Useful to bring up a link, to test link faults and the watchdog, and as
 * a placeholder until a real control law answers; it does not keep a loaded plant settled.
 */
public final class HoldController implements BoardController {
    private double samplePeriodS = Double.NaN;
    private boolean breakerClosed;
    private double pitchHoldRad;

    @Override
    public void setSamplePeriod(double samplePeriodS) {
        this.samplePeriodS = samplePeriodS;
    }

    @Override
    public void start(SensorView first) {
        breakerClosed = (first.statusFlags & SensorView.STATUS_BREAKER_CLOSED) != 0;
        final double p = first.pitchAngleRad;
        pitchHoldRad = p == p ? Math.max(-1.5, Math.min(1.5, p)) : 0.0;
    }

    @Override
    public void update(SensorView in, BoardCommand out) {
        out.block(breakerClosed);
        out.pitchRefRad = pitchHoldRad;
        out.boardStatus = 0;
    }

    /** Sample period given by {@link #setSamplePeriod}, s (NaN if never set). */
    public double samplePeriodS() {
        return samplePeriodS;
    }
}
