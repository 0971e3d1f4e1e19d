package dev.galebench.board.control;

/**
 * Grid-side current limiter in the voltage-oriented dq frame (pu of rated current). The total
 * current {@code sqrt(id^2 + iq^2)} never exceeds the limit. Normal operation: active priority
 * (d first, reactive gets what is left); fault ride-through: reactive priority (IEC 61400-27-1
 * current limiter with M_qpri = 1, REFERENCES.md 6c/7). An extra cap on the active current
 * carries the post-fault recovery ramp. Results are left in public fields (no allocation).
 */
public final class CurrentLimiter {
    /** Limited d reference, pu. */
    public double idPu;
    /** Limited q reference, pu. */
    public double iqPu;
    /** True when the d reference was reduced. */
    public boolean dClipped;
    /** True when the q reference was reduced. */
    public boolean qClipped;

    /**
     * @param idRefPu wanted active current (d), pu
     * @param iqRefPu wanted q current, pu
     * @param limitPu total current limit, pu
     * @param qPriority true during fault ride-through
     * @param activeCapPu extra bound on |id| (recovery ramp); at least 0
     */
    public void limit(double idRefPu, double iqRefPu, double limitPu, boolean qPriority, double activeCapPu) {
        double id;
        double iq;
        final double dCap = Math.min(limitPu, activeCapPu);
        if (qPriority) {
            iq = clamp(iqRefPu, limitPu);
            final double room = Math.sqrt(Math.max(0.0, limitPu * limitPu - iq * iq));
            id = clamp(idRefPu, Math.min(room, dCap));
        } else {
            id = clamp(idRefPu, dCap);
            final double room = Math.sqrt(Math.max(0.0, limitPu * limitPu - id * id));
            iq = clamp(iqRefPu, room);
        }
        dClipped = id != idRefPu;
        qClipped = iq != iqRefPu;
        idPu = id;
        iqPu = iq;
    }

    private static double clamp(double x, double bound) {
        return x > bound ? bound : (x < -bound ? -bound : x);
    }
}
