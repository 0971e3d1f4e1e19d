package dev.galebench.board.control;

/**
 * Synchronous-reference-frame PLL (Kaura and Blasko 1997, IEEE Trans. Ind. Appl. 33(1):58-63;
 * Teodorescu, Liserre and Rodriguez 2011). The q component of the voltage in the estimated
 * frame, normalised by the filtered amplitude, drives a PI whose output is added to the nominal
 * angular frequency; the angle integrates that frequency. Locked, the d axis lies on the
 * voltage vector ({@code v_q = 0}, {@code v_d = |v|}).
 *
 * <p>Small-signal loop with normalised input: {@code H(s) = (Kp s + Ki)/(s^2 + Kp s + Ki)}, so
 * {@code Kp = 2 zeta wn}, {@code Ki = wn^2} (REFERENCES.md section 4, DSP-SE derivation).
 *
 * <p>Normalisation uses {@code max(|v|, floor)}: above the floor the dynamics are voltage
 * independent; in a deep dip (below the floor, default 0.2 pu) the loop gain falls with the
 * voltage, which keeps the angle from being pulled around by a residual voltage that is mostly
 * the converter's own reactive current. Cost: slower re-lock after a deep dip with a phase jump.
 *
 * <p>Negative sequence: not separated here. Fed an unbalanced voltage, {@code v_q} carries a
 * ripple at twice the grid frequency. The reference controller feeds it the positive sequence
 * from its {@link Ddsrf} (the measured voltage less the negative-sequence estimate), so it locks
 * on the positive sequence without that ripple.
 */
public final class SrfPll {
    private double kp;
    private double ki;
    private double nominalOmega;
    private double normFloorV;
    private double samplePeriodS;
    private double thetaRad;
    private double omegaRadPerS;
    private double integralRadPerS;
    private double amplitudeV;
    private double vdV;
    private double vqV;
    private final LowPass amplitudeFilter = new LowPass();
    private double cosTheta = 1.0;
    private double sinTheta;
    private double lockTimerS;
    private boolean locked;

    /**
     * @param kp proportional gain, (rad/s) per rad
     * @param ki integral gain, (rad/s^2) per rad
     * @param nominalFrequencyHz feed-forward frequency
     * @param normFloorV smallest amplitude used for normalisation, V
     * @param samplePeriodS sample period, s
     */
    public void configure(double kp, double ki, double nominalFrequencyHz, double normFloorV,
            double samplePeriodS) {
        this.kp = kp;
        this.ki = ki;
        this.nominalOmega = Transforms.TWO_PI * nominalFrequencyHz;
        this.normFloorV = normFloorV;
        this.samplePeriodS = samplePeriodS;
        amplitudeFilter.configure(0.002, samplePeriodS);
    }

    /** Gains from natural frequency and damping, normalised input (Kp = 2 zeta wn, Ki = wn^2). */
    public static double kpFor(double naturalFrequencyRadPerS, double damping) {
        return 2.0 * damping * naturalFrequencyRadPerS;
    }

    public static double kiFor(double naturalFrequencyRadPerS) {
        return naturalFrequencyRadPerS * naturalFrequencyRadPerS;
    }

    /** Bumpless start: angle on the voltage vector, nominal frequency, filters at the measurement. */
    public void start(double alphaV, double betaV) {
        final double amp = Math.sqrt(alphaV * alphaV + betaV * betaV);
        thetaRad = amp > 0.0 ? Transforms.wrap(Math.atan2(betaV, alphaV)) : 0.0;
        omegaRadPerS = nominalOmega;
        integralRadPerS = 0.0;
        amplitudeFilter.reset(amp);
        amplitudeV = amp;
        cosTheta = Math.cos(thetaRad);
        sinTheta = Math.sin(thetaRad);
        vdV = amp;
        vqV = 0.0;
        locked = amp > normFloorV;
        lockTimerS = 0.0;
    }

    /** One sample with the alpha-beta voltage; updates angle, frequency and the dq voltage. */
    public void step(double alphaV, double betaV) {
        final double c = cosTheta;
        final double s = sinTheta;
        final double vd = Transforms.d(alphaV, betaV, c, s);
        final double vq = Transforms.q(alphaV, betaV, c, s);
        vdV = vd;
        vqV = vq;
        final double amp = amplitudeFilter.step(Math.sqrt(alphaV * alphaV + betaV * betaV));
        amplitudeV = amp;
        final double err = vq / Math.max(amp, normFloorV);
        integralRadPerS += ki * err * samplePeriodS;
        // bound the frequency correction to +-20 % of nominal: a lost lock cannot run away
        final double bound = 0.2 * nominalOmega;
        if (integralRadPerS > bound) {
            integralRadPerS = bound;
        } else if (integralRadPerS < -bound) {
            integralRadPerS = -bound;
        }
        omegaRadPerS = nominalOmega + kp * err + integralRadPerS;
        thetaRad = Transforms.wrap(thetaRad + omegaRadPerS * samplePeriodS);
        cosTheta = Math.cos(thetaRad);
        sinTheta = Math.sin(thetaRad);
        // lock: |angle error| < 0.05 rad and amplitude above the floor, for 20 ms
        if (Math.abs(err) < 0.05 && amp > normFloorV) {
            lockTimerS += samplePeriodS;
            if (lockTimerS >= 0.02) {
                locked = true;
                lockTimerS = 0.02;
            }
        } else {
            lockTimerS = 0.0;
            locked = false;
        }
    }

    /** Estimated angle of the voltage vector (d axis), rad in [0, 2 pi). Cos and sin of it: {@link #cos()}, {@link #sin()}. */
    public double angleRad() {
        return thetaRad;
    }

    public double cos() {
        return cosTheta;
    }

    public double sin() {
        return sinTheta;
    }

    /** Estimated angular frequency, rad/s. */
    public double omegaRadPerS() {
        return omegaRadPerS;
    }

    /** Estimated frequency, Hz. */
    public double frequencyHz() {
        return omegaRadPerS / Transforms.TWO_PI;
    }

    /** Filtered voltage amplitude (peak phase), V. */
    public double amplitudeV() {
        return amplitudeV;
    }

    /** d voltage in the frame used at the last step (before the angle update), V. */
    public double vdV() {
        return vdV;
    }

    /** q voltage in the frame used at the last step, V. */
    public double vqV() {
        return vqV;
    }

    public boolean locked() {
        return locked;
    }
}
