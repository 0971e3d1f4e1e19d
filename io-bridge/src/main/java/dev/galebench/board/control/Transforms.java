package dev.galebench.board.control;

/**
 * Clarke and Park transforms, amplitude-invariant, q axis leading d (the project's convention,
 * see {@code SensorView}). Each component is a separate static method returning one double, so
 * the hot path needs no result objects: a balanced set of peak amplitude X gives
 * {@code |(alpha, beta)| = |(d, q)| = X}.
 *
 * <pre>
 *   alpha = 2/3 (a - b/2 - c/2)        beta = (b - c) / sqrt 3
 *   d =  alpha cos(theta) + beta sin(theta)
 *   q = -alpha sin(theta) + beta cos(theta)
 *   inverse: alpha = d cos - q sin,  beta = d sin + q cos,
 *            a = alpha, b = -alpha/2 + sqrt3/2 beta, c = -alpha/2 - sqrt3/2 beta
 * </pre>
 * Source: the textbook amplitude-invariant transform (REFERENCES.md section 5, test vector
 * there). The zero sequence is dropped: the plant has no neutral connection.
 */
public final class Transforms {
    static final double SQRT3 = Math.sqrt(3.0);
    static final double INV_SQRT3 = 1.0 / SQRT3;
    static final double TWO_PI = 2.0 * Math.PI;

    private Transforms() {
    }

    /** Clarke alpha component. */
    public static double alpha(double a, double b, double c) {
        return (2.0 / 3.0) * (a - 0.5 * b - 0.5 * c);
    }

    /** Clarke beta component. */
    public static double beta(double b, double c) {
        return (b - c) * INV_SQRT3;
    }

    /** Park d component from alpha-beta, given cos and sin of the frame angle. */
    public static double d(double alpha, double beta, double cosTheta, double sinTheta) {
        return alpha * cosTheta + beta * sinTheta;
    }

    /** Park q component from alpha-beta, given cos and sin of the frame angle. */
    public static double q(double alpha, double beta, double cosTheta, double sinTheta) {
        return -alpha * sinTheta + beta * cosTheta;
    }

    /** Inverse Park: alpha from dq. */
    public static double alphaOf(double d, double q, double cosTheta, double sinTheta) {
        return d * cosTheta - q * sinTheta;
    }

    /** Inverse Park: beta from dq. */
    public static double betaOf(double d, double q, double cosTheta, double sinTheta) {
        return d * sinTheta + q * cosTheta;
    }

    /** Inverse Clarke, phase b. Phase a equals alpha (no zero sequence). */
    public static double phaseB(double alpha, double beta) {
        return -0.5 * alpha + 0.5 * SQRT3 * beta;
    }

    /** Inverse Clarke, phase c. */
    public static double phaseC(double alpha, double beta) {
        return -0.5 * alpha - 0.5 * SQRT3 * beta;
    }

    /** Wraps an angle to [0, 2 pi). */
    public static double wrap(double angleRad) {
        double a = angleRad % TWO_PI;
        return a < 0.0 ? a + TWO_PI : a;
    }

    /** Wraps an angle difference to (-pi, pi]. */
    public static double wrapPi(double angleRad) {
        double a = wrap(angleRad + Math.PI) - Math.PI;
        return a == -Math.PI ? Math.PI : a;
    }
}
