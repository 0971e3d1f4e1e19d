package dev.galebench.sequence;

/**
 * One timed action of a sequence's timeline, as parsed (times in seconds from the start of the
 * run, values in the units their names carry). {@link Schedule#compile} turns the list into a
 * step-indexed schedule; nothing here runs on the real-time thread.
 *
 * <p>Each kind acts on one or more <em>tracks</em> (wind, grid voltage per phase, grid phase,
 * grid frequency, grid strength, voltage-deviation reference, link). Actions on the same track
 * must not overlap in time; the wind gust and the turbulence are added on top of the wind track
 * and may overlap a wind step or ramp, but not each other.
 */
public sealed interface Action {
    /** Start time, s of plant time. */
    double atS();

    /** Where the action was written. */
    SourceMark mark();

    /** The key of the action in the file (e.g. {@code grid_dip}). */
    String kind();

    /** How long the action acts, s (0 for an instantaneous change). */
    double extentS();

    /** Sets the mean wind to {@code toMPerS} at once. */
    record WindStep(double atS, SourceMark mark, double toMPerS) implements Action {
        public String kind() { return "wind_step"; }
        public double extentS() { return 0; }
    }

    /** Changes the mean wind linearly from its present value to {@code toMPerS} over {@code durationS}. */
    record WindRamp(double atS, SourceMark mark, double toMPerS, double durationS) implements Action {
        public String kind() { return "wind_ramp"; }
        public double extentS() { return durationS; }
    }

    /**
     * Extreme operating gust shape of IEC 61400-1 ed. 3 (from memory, clause 6.3.3.2 there):
     * {@code V(t) = V - 0.37 Vgust sin(3 pi t / T) (1 - cos(2 pi t / T))} for {@code 0 <= t <= T},
     * added to the wind track. The dip before and after the peak is part of the shape; the peak
     * rise is {@code 0.74 Vgust} at {@code t = T/2}. The standard uses {@code T = 10.5 s}.
     */
    record WindGust(double atS, SourceMark mark, double amplitudeMPerS, double durationS) implements Action {
        public String kind() { return "wind_gust"; }
        public double extentS() { return durationS; }
    }

    /**
     * Longitudinal turbulence from the Kaimal spectrum (IEC 61400-1 ed. 3, Annex B, from memory):
     * {@code S(f) = 4 sigma^2 (L/V) / (1 + 6 f L / V)^(5/3)}, with {@code L = 8.1 Lambda1},
     * {@code Lambda1 = 42 m} above 60 m hub height, so {@code L = 340.2 m}. Synthesised as a sum
     * of cosines with seeded random phases, added to the wind track.
     */
    record Turbulence(double atS, SourceMark mark, double durationS, double sigmaMPerS, double intensity,
                      double lengthScaleM, double maxFrequencyHz, long seed) implements Action {
        public String kind() { return "turbulence"; }
        public double extentS() { return durationS; }
    }

    /**
     * Grid source voltage change per phase: {@code deltaPu[i]} is added to each phase (negative =
     * dip, positive = swell) for {@code durationS}, then the voltage returns linearly to its
     * previous level over {@code recoveryS} (0 = at once).
     */
    record GridVoltageEvent(double atS, SourceMark mark, String kind, double[] deltaPu, double durationS,
                            double recoveryS) implements Action {
        public double extentS() { return durationS + recoveryS; }
    }

    /** Steps the grid source phase by {@code angleDeg} (positive = leading). */
    record PhaseJump(double atS, SourceMark mark, double angleDeg) implements Action {
        public String kind() { return "phase_jump"; }
        public double extentS() { return 0; }
    }

    /** Steps the grid frequency to {@code toHz}. */
    record FrequencyStep(double atS, SourceMark mark, double toHz) implements Action {
        public String kind() { return "frequency_step"; }
        public double extentS() { return 0; }
    }

    /** Ramps the grid frequency to {@code toHz} at {@code rateHzPerS} (magnitude). */
    record FrequencyRamp(double atS, SourceMark mark, double toHz, double rateHzPerS, double durationS)
            implements Action {
        public String kind() { return "frequency_ramp"; }
        public double extentS() { return durationS; }
    }

    /** Changes the grid's short-circuit ratio and X/R at once. */
    record GridStrength(double atS, SourceMark mark, double shortCircuitRatio, double xOverR) implements Action {
        public String kind() { return "grid_strength"; }
        public double extentS() { return 0; }
    }

    /** Steps the plant-level controller's voltage-deviation reference to {@code deviationPu}. */
    record VoltageRefStep(double atS, SourceMark mark, double deviationPu) implements Action {
        public String kind() { return "voltage_ref_step"; }
        public double extentS() { return 0; }
    }

    /**
     * A link fault for {@code durationS} on the reply path: each reply is dropped, delayed by
     * {@code delayExchanges}, duplicated or corrupted with probability {@code rate} (a seeded,
     * deterministic sequence), or, for {@code silence}, every reply is lost (the watchdog should
     * trip).
     */
    record LinkFault(double atS, SourceMark mark, LinkFaultKind faultKind, double durationS, double rate,
                     int delayExchanges) implements Action {
        public String kind() { return "link_fault"; }
        public double extentS() { return durationS; }
    }
}
