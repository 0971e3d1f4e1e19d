package dev.galebench.board.control;

/**
 * Decoupled double synchronous reference frame (DDSRF): separates a three-wire alpha-beta
 * quantity into its positive and negative sequence (Rodriguez, Pou, Bergas, Candela, Burgos,
 * Boroyevich 2007, IEEE Trans. Power Electron. 22(2):584-592; equations below re-derived, the
 * filter ratio 1/sqrt2 from memory).
 *
 * <p>With the complex alpha-beta vector {@code x = X+ e^{j theta} + X- e^{-j theta}} and the
 * positive-sequence angle theta from the PLL:
 * <pre>
 *   positive frame (theta):   x e^{-j theta} = X+ + X- e^{-j 2 theta}
 *   negative frame (-theta):  x e^{+j theta} = X- + X+ e^{+j 2 theta}
 *   decoupled:  X+* = x e^{-j theta} - LPF(X-*) e^{-j 2 theta}
 *               X-* = x e^{+j theta} - LPF(X+*) e^{+j 2 theta}
 * </pre>
 * The low-pass filters (first order, cut-off {@code omega/sqrt2}) give the sequence components
 * {@code X+bar, X-bar}. The decoupled, unfiltered {@code X+*} carries the positive sequence
 * without the 2f ripple once {@code X-bar} has settled and without the filter's lag; on a
 * balanced set {@code X-bar = 0} and {@code X+* } is the plain Park transform.
 *
 * <p>Negative frame (Park with angle {@code -theta}):
 * {@code d- = alpha cos(theta) - beta sin(theta)}, {@code q- = alpha sin(theta) + beta cos(theta)}.
 * Primitive state, nothing allocated in {@link #step}.
 */
public final class Ddsrf {
    private final LowPass posDFilter = new LowPass();
    private final LowPass posQFilter = new LowPass();
    private final LowPass negDFilter = new LowPass();
    private final LowPass negQFilter = new LowPass();

    /** Decoupled (unfiltered) positive sequence in the positive frame. */
    public double posD, posQ;
    /** Decoupled (unfiltered) negative sequence in the negative frame. */
    public double negD, negQ;

    /** Filter time constant for the grid angular frequency: {@code sqrt2 / omega} (cut-off omega/sqrt2). */
    public static double filterTimeConstantS(double omegaRadPerS) {
        return Math.sqrt(2.0) / omegaRadPerS;
    }

    public void configure(double filterTimeConstantS, double samplePeriodS) {
        posDFilter.configure(filterTimeConstantS, samplePeriodS);
        posQFilter.configure(filterTimeConstantS, samplePeriodS);
        negDFilter.configure(filterTimeConstantS, samplePeriodS);
        negQFilter.configure(filterTimeConstantS, samplePeriodS);
    }

    /** Bumpless start: the input taken as pure positive sequence. */
    public void start(double alpha, double beta, double cosTheta, double sinTheta) {
        posD = Transforms.d(alpha, beta, cosTheta, sinTheta);
        posQ = Transforms.q(alpha, beta, cosTheta, sinTheta);
        negD = 0.0;
        negQ = 0.0;
        posDFilter.reset(posD);
        posQFilter.reset(posQ);
        negDFilter.reset(0.0);
        negQFilter.reset(0.0);
    }

    /** One sample with the alpha-beta input and cos, sin of the positive-sequence angle. */
    public void step(double alpha, double beta, double c, double s) {
        final double c2 = c * c - s * s;
        final double s2 = 2.0 * s * c;
        final double nD = negDFilter.value();
        final double nQ = negQFilter.value();
        final double pD = posDFilter.value();
        final double pQ = posQFilter.value();
        // X-bar e^{-j2theta} = (nD + j nQ)(c2 - j s2)
        posD = alpha * c + beta * s - (nD * c2 + nQ * s2);
        posQ = -alpha * s + beta * c - (nQ * c2 - nD * s2);
        // X+bar e^{+j2theta} = (pD + j pQ)(c2 + j s2)
        negD = alpha * c - beta * s - (pD * c2 - pQ * s2);
        negQ = alpha * s + beta * c - (pQ * c2 + pD * s2);
        posDFilter.step(posD);
        posQFilter.step(posQ);
        negDFilter.step(negD);
        negQFilter.step(negQ);
    }

    /** Filtered positive sequence, positive frame. */
    public double posDBar() {
        return posDFilter.value();
    }

    public double posQBar() {
        return posQFilter.value();
    }

    /** Filtered negative sequence, negative frame. */
    public double negDBar() {
        return negDFilter.value();
    }

    public double negQBar() {
        return negQFilter.value();
    }

    /** Alpha of the negative-sequence vector {@code X-bar e^{-j theta}}. */
    public static double negAlpha(double d, double q, double c, double s) {
        return d * c + q * s;
    }

    /** Beta of the negative-sequence vector {@code X-bar e^{-j theta}}. */
    public static double negBeta(double d, double q, double c, double s) {
        return q * c - d * s;
    }
}
