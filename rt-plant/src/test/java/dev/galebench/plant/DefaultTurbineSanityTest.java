package dev.galebench.plant;

import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

/**
 * The shipped turbine against open reference turbines: NREL 5-MW (Jonkman et al. 2009,
 * NREL/TP-500-38060) and IEA 15-MW (Gaertner et al. 2020, NREL/TP-5000-75698), values from
 * REFERENCES.md 1b/1c; rules of thumb from REFERENCES.md 9 (common practice).
 */
class DefaultTurbineSanityTest {
    private final TurbineParameters p = TurbineFile.defaults();

    private static void within(double value, double lo, double hi, String what) {
        assertTrue(value >= lo && value <= hi, what + " = " + value + " not in [" + lo + ", " + hi + "]");
    }

    @Test
    void shouldHaveAReferenceTurbineLikeRotor() {
        double area = Math.PI * p.rotorRadiusM * p.rotorRadiusM;
        // specific rating: NREL 5-MW 401 W/m2, IEA 15-MW 332 W/m2 (derived from rated power and diameter)
        within(p.ratedPowerW / area, 0.9 * 332.0, 1.1 * 401.0, "specific rating W/m2");
        // tip speed at rated: NREL 5-MW 12.1 rpm * 63 m = 79.8 m/s, IEA 15-MW 95 m/s
        within(p.ratedRotorSpeedRadPerS * p.rotorRadiusM, 79.8, 95.0, "tip speed m/s");
        // rated wind: NREL 5-MW 11.4 m/s, IEA 15-MW 10.59 m/s
        within(p.ratedWindMPerS, 10.0, 11.9, "rated wind m/s");
        // cut-in / cut-out: both reference turbines 3 / 25 m/s
        within(p.cutInWindMPerS, 3.0, 4.0, "cut-in m/s");
        within(p.cutOutWindMPerS, 20.0, 25.0, "cut-out m/s");
        // peak Cp: NREL 5-MW 0.482 at 7.55, IEA 15-MW ~0.476 at ~9.0
        CpSurface cps = CpSurface.of(p);
        within(cps.maxCp(), 0.45, 0.50, "Cp max");
        within(cps.optimalTipSpeedRatio(), 7.55, 9.0, "lambda opt");
        // inertia constant: NREL 5-MW 7.03 s, IEA 15-MW 6.53 s
        double h = PerUnitBase.gridSide(p).inertiaConstantS(p.rotorInertiaKgM2 + p.generatorInertiaKgM2 * p.gearRatio * p.gearRatio);
        within(h, 5.0, 9.0, "H s");
        // pitch-rate limit: NREL 5-MW 8 deg/s, IEA 15-MW 2 deg/s
        within(Math.toDegrees(p.pitchRateMaxRadPerS), 2.0, 8.01, "pitch rate deg/s");
    }

    @Test
    void shouldFollowTheConverterRulesOfThumb() {
        PerUnitBase b = PerUnitBase.gridSide(p);
        // common practice: V_dc 1050-1200 V for 690 V; tau_dc 2-10 ms; choke 0.10-0.20 pu; u_k 6-10 %; SCR > 3
        within(p.dcVoltageNominalV, 1050.0, 1200.0, "V_dc");
        within(p.dcCapacitanceF * p.dcVoltageNominalV * p.dcVoltageNominalV / (2.0 * p.ratedPowerW), 0.002, 0.010, "tau_dc s");
        within(b.inductanceToPu(p.chokeInductanceH), 0.10, 0.20, "choke pu");
        within(p.converterTransformerShortCircuitPu, 0.06, 0.10, "u_k");
        within(p.converterTransformerXOverR, 5.0, 10.0, "transformer X/R");
        within(p.shortCircuitRatio, 3.0, 20.0, "SCR");
        within(p.switchingFrequencyHz, 1500.0, 5000.0, "f_sw");
        // current trip above the 1.1-1.2 pu current limit band, with the short-time 1.3 pu margin
        within(p.gscCurrentTripA / (Math.sqrt(2.0) * p.converterRatedCurrentA), 1.3, 2.0, "GSC trip pu");
        // rated steady state uses less than the linear modulation range on both converters
        OperatingPoint rated = SteadyState.solve(p, 14.0, 1.0, 0.0);
        within(rated.mscModulation, 0.5, 0.95, "MSC modulation at rated");
        within(rated.gscModulation, 0.5, 0.95, "GSC modulation at rated");
        // rated electrical power within 5 % of rated (losses of a few per cent)
        within(rated.gridPowerW / p.ratedPowerW, 0.95, 1.0, "p_grid at rated");
    }
}
