package dev.galebench.plant;

/**
 * Turns a converter voltage reference in a rotating dq frame into the per-phase duties of
 * {@link BoardCommand} (leg voltage {@code (2d - 1) Vdc/2}), with min-max zero-sequence
 * injection (equivalent to space-vector modulation): the linear range reaches a peak phase
 * voltage of {@code Vdc / sqrt(3)}. Beyond it the duties are clipped to [0, 1].
 *
 * <p>Allocation-free; meant for open-loop drivers, tests and reference controllers. A real
 * board computes its duties itself.
 */
public final class Modulation {
    private static final double SQRT3_2 = Math.sqrt(3.0) / 2.0;

    private Modulation() {
    }

    /** Machine-side duties for (vd, vq) in the rotor frame at electrical angle {@code angleRad}. */
    public static void mscDuties(BoardCommand cmd, double vdV, double vqV, double angleRad, double dcVoltageV) {
        final double[] d = legDuties(vdV, vqV, angleRad, dcVoltageV);
        cmd.mscDutyA = d[0];
        cmd.mscDutyB = d[1];
        cmd.mscDutyC = d[2];
    }

    /** Grid-side duties for (vd, vq) in the grid frame at angle {@code angleRad}. */
    public static void gscDuties(BoardCommand cmd, double vdV, double vqV, double angleRad, double dcVoltageV) {
        final double[] d = legDuties(vdV, vqV, angleRad, dcVoltageV);
        cmd.gscDutyA = d[0];
        cmd.gscDutyB = d[1];
        cmd.gscDutyC = d[2];
    }

    /**
     * Leg duties a, b, c for a dq voltage at {@code angleRad}, with the min/max zero sequence of
     * SVPWM added. Allocates its result: used when a run is set up, never on the real-time path.
     */
    static double[] legDuties(double vdV, double vqV, double angleRad, double dcVoltageV) {
        final double c = Math.cos(angleRad);
        final double s = Math.sin(angleRad);
        final double va = vdV * c - vqV * s;
        final double vbeta = vdV * s + vqV * c;
        final double vb = -0.5 * va + SQRT3_2 * vbeta;
        final double vc = -0.5 * va - SQRT3_2 * vbeta;
        final double zero = -0.5 * (Math.max(va, Math.max(vb, vc)) + Math.min(va, Math.min(vb, vc)));
        final double inv = dcVoltageV > 1e-9 ? 1.0 / dcVoltageV : 0.0;
        return new double[] {clip(0.5 + (va + zero) * inv), clip(0.5 + (vb + zero) * inv), clip(0.5 + (vc + zero) * inv)};
    }

    private static double clip(double d) {
        return d < 0.0 ? 0.0 : (d > 1.0 ? 1.0 : d);
    }
}
