package dev.galebench.plant;

/**
 * Analytic power coefficient surface of the Heier/Slootweg family (REFERENCES.md section 1a):
 *
 * <pre>
 *   Cp = c1 (c2/li - c3 b - c4 b^x - c5) exp(-c6/li) + c7 lambda
 *   1/li = 1/(lambda + c8 b) - c9/(b^3 + 1)          (b = pitch in degrees)
 * </pre>
 *
 * The default turbine uses the "Heier variant" (c1 = 0.5176, c2 = 116, c3 = 0.4, c4 = 0,
 * c5 = 5, c6 = 21, c7 = 0.0068, c8 = 0.08, c9 = 0.035). The formula is a fit for the
 * power-producing range; outside it this class applies two documented guards: pitch below 0
 * degrees is evaluated as 0 (the fit has a pole at b = -1), and where
 * {@code lambda + c8 b <= 0} the result is 0.
 *
 * <p>{@link #cp} allocates nothing and takes one {@code exp} (plus one {@code pow} only if
 * c4 is non-zero), so the plant calls it inside every integration stage. The optimum at pitch
 * 0 is found once, at construction, by a grid scan and a golden-section refinement.
 */
public final class CpSurface {
    private final double c1, c2, c3, c4, c5, c6, c7, c8, c9, x;
    private final boolean hasC4;
    private final double optimalTipSpeedRatio;
    private final double maxCp;

    private CpSurface(double c1, double c2, double c3, double c4, double c5, double c6,
                      double c7, double c8, double c9, double x) {
        this.c1 = c1; this.c2 = c2; this.c3 = c3; this.c4 = c4; this.c5 = c5;
        this.c6 = c6; this.c7 = c7; this.c8 = c8; this.c9 = c9; this.x = x;
        this.hasC4 = c4 != 0.0;
        this.optimalTipSpeedRatio = argMax(0.0);
        this.maxCp = cp(optimalTipSpeedRatio, 0.0);
    }

    /** The surface of a turbine's parameters ({@code rotor.cp_c1 .. rotor.cp_c9, rotor.cp_x}). */
    public static CpSurface of(TurbineParameters p) {
        return new CpSurface(p.cpC1, p.cpC2, p.cpC3, p.cpC4, p.cpC5, p.cpC6, p.cpC7, p.cpC8, p.cpC9, p.cpX);
    }

    /** A surface from explicit coefficients (order as in the formula; {@code x} is the exponent of the c4 term). */
    public static CpSurface of(double c1, double c2, double c3, double c4, double c5, double c6,
                               double c7, double c8, double c9, double x) {
        return new CpSurface(c1, c2, c3, c4, c5, c6, c7, c8, c9, x);
    }

    /** Power coefficient at tip-speed ratio {@code tipSpeedRatio} and pitch {@code pitchDeg} (degrees). */
    public double cp(double tipSpeedRatio, double pitchDeg) {
        final double b = pitchDeg > 0.0 ? pitchDeg : 0.0;
        final double den = tipSpeedRatio + c8 * b;
        if (!(den > 1e-9)) {
            return 0.0;
        }
        final double inv = 1.0 / den - c9 / (b * b * b + 1.0);
        double bracket = c2 * inv - c3 * b - c5;
        if (hasC4) {
            bracket -= c4 * Math.pow(b, x);
        }
        return c1 * bracket * Math.exp(-c6 * inv) + c7 * tipSpeedRatio;
    }

    /** Maximum of Cp over lambda at pitch 0. */
    public double maxCp() {
        return maxCp;
    }

    /** Tip-speed ratio of the maximum at pitch 0. */
    public double optimalTipSpeedRatio() {
        return optimalTipSpeedRatio;
    }

    /** Tip-speed ratio of the maximum at pitch {@code pitchDeg} (searched on each call; not for the hot path). */
    public double optimalTipSpeedRatio(double pitchDeg) {
        return argMax(pitchDeg);
    }

    /** Maximum of Cp over lambda at pitch {@code pitchDeg} (searched on each call; not for the hot path). */
    public double maxCp(double pitchDeg) {
        return cp(argMax(pitchDeg), pitchDeg);
    }

    /** Grid scan over lambda in [0.5, 25] (step 0.01), then golden section around the best point. */
    private double argMax(double pitchDeg) {
        double best = 0.5;
        double bestCp = cp(best, pitchDeg);
        for (int i = 1; i <= 2450; i++) {
            double l = 0.5 + 0.01 * i;
            double c = cp(l, pitchDeg);
            if (c > bestCp) {
                bestCp = c;
                best = l;
            }
        }
        double a = Math.max(0.5, best - 0.01);
        double b = best + 0.01;
        final double g = (Math.sqrt(5.0) - 1.0) / 2.0;
        double x1 = b - g * (b - a);
        double x2 = a + g * (b - a);
        double f1 = cp(x1, pitchDeg);
        double f2 = cp(x2, pitchDeg);
        for (int i = 0; i < 200 && b - a > 1e-13; i++) {
            if (f1 < f2) {
                a = x1; x1 = x2; f1 = f2; x2 = a + g * (b - a); f2 = cp(x2, pitchDeg);
            } else {
                b = x2; x2 = x1; f2 = f1; x1 = b - g * (b - a); f1 = cp(x1, pitchDeg);
            }
        }
        return 0.5 * (a + b);
    }
}
