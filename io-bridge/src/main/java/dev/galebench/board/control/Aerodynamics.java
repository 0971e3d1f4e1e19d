package dev.galebench.board.control;

import dev.galebench.plant.CpSurface;
import dev.galebench.plant.TurbineParameters;

/**
 * Off-line aerodynamic numbers the tuning needs: the Cp optimum at pitch 0 and the pitch
 * sensitivity of the aerodynamic power at rated speed, from the turbine's analytic Cp surface
 * ({@link CpSurface}, REFERENCES.md 1a). Not used on the real-time path.
 */
final class Aerodynamics {
    private Aerodynamics() {
    }

    /** {lambda_opt, Cp_max} at pitch 0, from the plant's own surface (same formula, same search). */
    static double[] optimum(TurbineParameters p) {
        final CpSurface cps = CpSurface.of(p);
        return new double[] {cps.optimalTipSpeedRatio(), cps.maxCp()};
    }

    /** Aerodynamic power at rated rotor speed, W. */
    static double powerAtRatedSpeed(TurbineParameters p, double windMPerS, double pitchDeg) {
        final double lambda = p.ratedRotorSpeedRadPerS * p.rotorRadiusM / windMPerS;
        return 0.5 * p.airDensityKgPerM3 * Math.PI * p.rotorRadiusM * p.rotorRadiusM * windMPerS * windMPerS
                * windMPerS * CpSurface.of(p).cp(lambda, pitchDeg);
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
