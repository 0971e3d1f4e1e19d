package dev.galebench.board.control;

import dev.galebench.plant.TurbineParameters;

/**
 * Off-line aerodynamic numbers the tuning needs: the Cp optimum at pitch 0 and the pitch
 * sensitivity of the aerodynamic power at rated speed. Uses the turbine file's analytic
 * Cp(lambda, beta) surface (Heier/Slootweg family, REFERENCES.md 1a, beta in degrees):
 * {@code Cp = c1 (c2/li - c3 b - c4 b^x - c5) exp(-c6/li) + c7 lambda},
 * {@code 1/li = 1/(lambda + c8 b) - c9/(b^3 + 1)}. Not used on the real-time path.
 */
final class Aerodynamics {
    private Aerodynamics() {
    }

    static double cp(TurbineParameters p, double lambda, double betaDeg) {
        final double invLi = 1.0 / (lambda + p.cpC8 * betaDeg) - p.cpC9 / (betaDeg * betaDeg * betaDeg + 1.0);
        final double pow = p.cpC4 == 0.0 ? 0.0 : p.cpC4 * Math.pow(Math.max(betaDeg, 0.0), p.cpX);
        return p.cpC1 * (p.cpC2 * invLi - p.cpC3 * betaDeg - pow - p.cpC5) * Math.exp(-p.cpC6 * invLi)
                + p.cpC7 * lambda;
    }

    /** {lambda_opt, Cp_max} at pitch 0: a 0.01 grid over lambda 1..25, then golden-section refinement. */
    static double[] optimum(TurbineParameters p) {
        double best = 1.0;
        double bestCp = Double.NEGATIVE_INFINITY;
        for (double l = 1.0; l <= 25.0; l += 0.01) {
            final double c = cp(p, l, 0.0);
            if (c > bestCp) {
                bestCp = c;
                best = l;
            }
        }
        double a = best - 0.01;
        double b = best + 0.01;
        final double g = (Math.sqrt(5.0) - 1.0) / 2.0;
        for (int i = 0; i < 80; i++) {
            final double x1 = b - g * (b - a);
            final double x2 = a + g * (b - a);
            if (cp(p, x1, 0.0) > cp(p, x2, 0.0)) {
                b = x2;
            } else {
                a = x1;
            }
        }
        final double l = 0.5 * (a + b);
        return new double[] {l, cp(p, l, 0.0)};
    }

    /** Aerodynamic power at rated rotor speed, W. */
    static double powerAtRatedSpeed(TurbineParameters p, double windMPerS, double pitchDeg) {
        final double lambda = p.ratedRotorSpeedRadPerS * p.rotorRadiusM / windMPerS;
        return 0.5 * p.airDensityKgPerM3 * Math.PI * p.rotorRadiusM * p.rotorRadiusM * windMPerS * windMPerS
                * windMPerS * cp(p, lambda, pitchDeg);
    }

    /** Pitch (deg) at which the aerodynamic power at rated speed equals rated power; 0 if the wind is too weak. */
    static double pitchForRatedPowerDeg(TurbineParameters p, double windMPerS) {
        double lo = Math.max(0.0, Math.toDegrees(p.pitchMinRad));
        double hi = Math.toDegrees(p.pitchMaxRad);
        if (powerAtRatedSpeed(p, windMPerS, lo) <= p.ratedPowerW) {
            return lo;
        }
        for (int i = 0; i < 100; i++) {
            final double mid = 0.5 * (lo + hi);
            if (powerAtRatedSpeed(p, windMPerS, mid) > p.ratedPowerW) {
                lo = mid;
            } else {
                hi = mid;
            }
        }
        return 0.5 * (lo + hi);
    }

    /**
     * Pitch sensitivity dP/dtheta (W/rad) along the rated-power operating line, fitted linearly
     * in pitch over winds from rated to cut-out: returns {sensitivity at pitch 0 (negative),
     * theta_K in rad (pitch at which the sensitivity doubles)}.
     */
    static double[] pitchSensitivity(TurbineParameters p) {
        final int n = 12;
        double sx = 0, sy = 0, sxx = 0, sxy = 0;
        int used = 0;
        final double h = 0.05; // deg
        for (int i = 0; i < n; i++) {
            final double v = p.ratedWindMPerS + 0.5 + (p.cutOutWindMPerS - p.ratedWindMPerS - 0.5) * i / (n - 1.0);
            final double th = pitchForRatedPowerDeg(p, v);
            final double dPdDeg = (powerAtRatedSpeed(p, v, th + h) - powerAtRatedSpeed(p, v, th - h)) / (2 * h);
            final double s = dPdDeg * 180.0 / Math.PI; // W/rad
            final double x = Math.toRadians(th);
            if (s < 0.0) {
                sx += x;
                sy += s;
                sxx += x * x;
                sxy += x * s;
                used++;
            }
        }
        if (used < 2) {
            throw new IllegalArgumentException("turbine: the Cp surface gives no negative pitch sensitivity above rated wind");
        }
        final double slope = (used * sxy - sx * sy) / (used * sxx - sx * sx);
        final double intercept = (sy - slope * sx) / used;
        final double thetaK = slope != 0.0 && intercept / slope > 0.0 ? intercept / slope : 1.0e3;
        return new double[] {intercept, thetaK};
    }
}
