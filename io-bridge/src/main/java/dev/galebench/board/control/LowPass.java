package dev.galebench.board.control;

/**
 * First-order low-pass filter, discretised exactly for a held input
 * ({@code y += (1 - exp(-Ts/tau)) (x - y)}). A time constant of 0 passes the input through.
 * Mutable primitive state; {@link #step} allocates nothing.
 */
public final class LowPass {
    private double gain = 1.0;
    private double y;

    /** Sets the time constant for sample period {@code samplePeriodS}. */
    public void configure(double timeConstantS, double samplePeriodS) {
        gain = timeConstantS <= 0.0 ? 1.0 : 1.0 - Math.exp(-samplePeriodS / timeConstantS);
    }

    /** Sets the output (bumpless start). */
    public void reset(double value) {
        y = value;
    }

    /** One sample; returns the filtered value. */
    public double step(double x) {
        y += gain * (x - y);
        return y;
    }

    /** Last output. */
    public double value() {
        return y;
    }
}
