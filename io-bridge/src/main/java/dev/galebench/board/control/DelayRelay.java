package dev.galebench.board.control;

/**
 * A protection stage with a definite-time delay: it operates once its condition has held
 * without a break for the delay. Timer in seconds, primitives only.
 */
final class DelayRelay {
    private double delayS;
    private double timerS;

    void configure(double delayS) {
        this.delayS = delayS;
        timerS = 0.0;
    }

    /** Advances the timer; returns true when the condition has held for the delay. */
    boolean step(boolean condition, double samplePeriodS) {
        if (condition) {
            timerS += samplePeriodS;
            return timerS >= delayS;
        }
        timerS = 0.0;
        return false;
    }

    void reset() {
        timerS = 0.0;
    }
}
