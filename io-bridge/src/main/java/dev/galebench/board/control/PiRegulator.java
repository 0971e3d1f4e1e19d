package dev.galebench.board.control;

/**
 * Proportional-integral regulator {@code u = kp e + ki integral(e)} (parallel form, so {@code ki}
 * is the integral gain of {@code kp + ki/s}), forward-Euler integral, output limits and
 * anti-windup by conditional integration: while the output sits on a limit, the integrator
 * does not move further into it. Why conditional integration: it needs no tuning (a
 * back-calculation gain would be one more setting) and it recovers without overshoot after
 * long saturation, e.g. the DC-voltage loop during a fault.
 */
public final class PiRegulator {
    private double kp;
    private double ki;
    private double min = Double.NEGATIVE_INFINITY;
    private double max = Double.POSITIVE_INFINITY;
    private double integral;
    private boolean saturated;

    public void setGains(double kp, double ki) {
        this.kp = kp;
        this.ki = ki;
    }

    public void setLimits(double min, double max) {
        this.min = min;
        this.max = max;
    }

    /** Sets the integral part so the output equals {@code output} at zero error (bumpless start). */
    public void resetTo(double output) {
        integral = output;
    }

    /** Integral part (in output units). */
    public double integral() {
        return integral;
    }

    public double kp() {
        return kp;
    }

    public double ki() {
        return ki;
    }

    /** True when the last output was clipped. */
    public boolean saturated() {
        return saturated;
    }

    /**
     * One sample.
     *
     * @param error reference minus measurement
     * @param samplePeriodS time since the previous sample
     * @param freeze true to hold the integral (an outer limiter clipped the output downstream)
     */
    public double step(double error, double samplePeriodS, boolean freeze) {
        final double candidate = integral + ki * error * samplePeriodS;
        final double pPart = kp * error;
        double u = pPart + candidate;
        saturated = false;
        if (u > max) {
            u = max;
            saturated = true;
            if (!freeze && error < 0.0) {
                integral = candidate;
            }
            if (integral > max) {
                integral = max;
            }
        } else if (u < min) {
            u = min;
            saturated = true;
            if (!freeze && error > 0.0) {
                integral = candidate;
            }
            if (integral < min) {
                integral = min;
            }
        } else if (!freeze) {
            integral = candidate;
        }
        return u;
    }
}
