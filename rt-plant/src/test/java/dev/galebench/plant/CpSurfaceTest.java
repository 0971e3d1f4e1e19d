package dev.galebench.plant;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/** Cp surfaces against the values of REFERENCES.md section 1a (derived there from the published coefficient sets). */
class CpSurfaceTest {
    private static final CpSurface HEIER_VARIANT = CpSurface.of(0.5176, 116, 0.4, 0, 5, 21, 0.0068, 0.08, 0.035, 0);
    private static final CpSurface HEIER_BOOK = CpSurface.of(0.5, 116, 0.4, 0, 5, 21, 0, 0.08, 0.035, 0);
    private static final CpSurface SLOOTWEG = CpSurface.of(0.73, 151, 0.58, 0.002, 13.2, 18.4, 0, -0.02, 0.003, 2.14);

    @Test
    void shouldMatchHeierVariantOptimum() {
        // Source: Heier variant coefficients (Thongam et al. 2009 as listed by the SD-code,
        // Saint-Drenan et al. 2020); optimum derived in REFERENCES.md 1a: lambda 8.100, Cp 0.4800.
        assertEquals(8.100, HEIER_VARIANT.optimalTipSpeedRatio(), 0.001);
        assertEquals(0.4800, HEIER_VARIANT.maxCp(), 0.00005);
        assertEquals(0.4798, HEIER_VARIANT.cp(8.0, 0.0), 0.00005);
        assertEquals(0.4513, HEIER_VARIANT.cp(7.0, 0.0), 0.00005);
        assertEquals(0.4620, HEIER_VARIANT.cp(9.0, 0.0), 0.00005);
    }

    @Test
    void shouldMatchHeierBookAndSlootwegOptima() {
        // Source: Heier 1998 (book form) and Slootweg et al. 2003 coefficient sets via the SD-code;
        // optima derived in REFERENCES.md 1a.
        assertEquals(7.954, HEIER_BOOK.optimalTipSpeedRatio(), 0.001);
        assertEquals(0.4110, HEIER_BOOK.maxCp(), 0.00005);
        assertEquals(6.908, SLOOTWEG.optimalTipSpeedRatio(), 0.001);
        assertEquals(0.4412, SLOOTWEG.maxCp(), 0.00005);
    }

    @ParameterizedTest(name = "pitch {0} deg")
    @CsvSource({"2, 10.10, 0.4354", "5, 9.23, 0.3576", "10, 7.49, 0.2561", "15, 6.08, 0.1840", "20, 4.90, 0.1325"})
    void shouldMatchHeierVariantPitchSweep(double pitchDeg, double lambdaOpt, double cpMax) {
        // Source: REFERENCES.md 1a, Heier variant pitch sweep with c8 = 0.08 (derived values).
        assertEquals(lambdaOpt, HEIER_VARIANT.optimalTipSpeedRatio(pitchDeg), 0.006);
        assertEquals(cpMax, HEIER_VARIANT.maxCp(pitchDeg), 0.00006);
    }

    @ParameterizedTest(name = "pitch {0} deg")
    @CsvSource({"2, 6.71, 0.3826", "5, 6.30, 0.3075", "10, 5.69, 0.2104", "15, 5.21, 0.1411", "20, 4.81, 0.0926"})
    void shouldMatchSlootwegPitchSweep(double pitchDeg, double lambdaOpt, double cpMax) {
        // Source: REFERENCES.md 1a, Slootweg et al. 2003 fit, pitch sweep (derived values).
        assertEquals(lambdaOpt, SLOOTWEG.optimalTipSpeedRatio(pitchDeg), 0.006);
        assertEquals(cpMax, SLOOTWEG.maxCp(pitchDeg), 0.00006);
    }

    @Test
    void shouldUseTheHeierVariantInTheDefaultTurbine() {
        CpSurface s = CpSurface.of(TurbineFile.defaults());
        assertEquals(HEIER_VARIANT.maxCp(), s.maxCp(), 0.0);
        assertEquals(HEIER_VARIANT.optimalTipSpeedRatio(), s.optimalTipSpeedRatio(), 0.0);
    }

    @Test
    void shouldStayFiniteOutsideTheFittedRange() {
        assertEquals(0.0, HEIER_VARIANT.cp(0.0, 0.0), 0.0);
        assertEquals(HEIER_VARIANT.cp(8.0, 0.0), HEIER_VARIANT.cp(8.0, -3.0), 0.0);
        assertEquals(true, Double.isFinite(SLOOTWEG.cp(0.05, 10.0)));
    }
}
