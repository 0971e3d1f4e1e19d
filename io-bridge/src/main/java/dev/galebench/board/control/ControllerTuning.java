package dev.galebench.board.control;

import dev.galebench.plant.TurbineParameters;
import java.util.LinkedHashMap;
import java.util.Map;

/**
 * Every gain and base the reference controller uses, derived once from the turbine file and the
 * controller file. Immutable; the controller copies the numbers into primitives at start.
 *
 * <h2>Formulas and sources</h2>
 * <ul>
 *   <li>Current loops, internal model control (Harnefors and Nee 1998, IEEE Trans. Ind. Appl.
 *       34(1):133-141): {@code alpha = ln 9 / t_rise}, {@code Kp = alpha L}, {@code Ki = alpha R};
 *       closed loop {@code alpha/(s + alpha)}, so the 10-90 % rise time is {@code t_rise}.
 *       Machine side: per axis with {@code Ld}, {@code Lq}, {@code Rs}. Grid side: with the total
 *       series impedance between the converter and the grid source: choke + converter
 *       transformer + plant transformer + Thevenin grid at the file's short-circuit ratio, all
 *       referred to the LV side.</li>
 *   <li>DC-link voltage loop (REFERENCES.md 3b, linearised energy balance
 *       {@code C Vdc0 dVdc/dt = 1.5 V_g i_d} with the d axis on the grid voltage peak V_g):
 *       {@code Kp = 2 zeta wn C Vdc0/(1.5 V_g)}, {@code Ki = wn^2 C Vdc0/(1.5 V_g)}.</li>
 *   <li>PLL (REFERENCES.md 4, normalised q voltage): {@code Kp = 2 zeta wn}, {@code Ki = wn^2}.</li>
 *   <li>MPPT: {@code T_opt = k_opt w^2}, {@code k_opt = 1/2 rho pi R^5 Cp_max / lambda_opt^3}
 *       on the rotor shaft, divided by {@code N^3} on the generator shaft (REFERENCES.md 2).</li>
 *   <li>Pitch PI on generator-speed error with gain scheduling (Jonkman et al. 2009,
 *       NREL/TP-500-38060, section 7.4, from memory): {@code Kp = 2 J W0 zeta wn / (N (-dP/dtheta))},
 *       {@code Ki = J W0 wn^2 / (N (-dP/dtheta))} at pitch 0, scheduled by
 *       {@code 1/(1 + theta/theta_K)}, theta_K the pitch at which the sensitivity doubles;
 *       the sensitivity comes from the turbine's own Cp surface at rated speed.</li>
 * </ul>
 */
public final class ControllerTuning {
    /** ln 9: ratio of 10-90 % rise time to the time constant of a first-order lag. */
    public static final double LN9 = Math.log(9.0);

    public final TurbineParameters turbine;
    public final ControllerSettings settings;

    // bases
    public final double gridOmegaRadPerS, gridVoltageBaseV, gridCurrentBaseA;
    public final double statorCurrentBaseA, ratedGeneratorSpeedRadPerS, ratedTorqueNm, maxTorqueNm;
    // grid impedances (LV side)
    public final double totalResistanceOhm, totalInductanceH, beyondTerminalResistanceOhm, beyondTerminalInductanceH;
    // current loops
    public final double gscAlphaRadPerS, gscKp, gscKi;
    /**
     * Negative-sequence current loop (PI in the frame at -theta on L_tot): {@code alpha2 = ln9/(2 t_r)}
     * (half the positive loop's, under the DDSRF filter's cut-off {@code omega/sqrt2}: the loop's
     * feedback is the filtered sequence), {@code Kp = alpha2 L_tot}, {@code Ki = alpha2^2 L_tot / 4}:
     * on {@code s L_tot} a critically damped pair at {@code alpha2/2}. Not the IMC {@code Ki = alpha R}
     * of the positive loop: that one rejects a voltage disturbance only with the plant's own
     * {@code R/L} (about 44 ms), too slow against the positive loop's 2f reaction during a dip.
     */
    public final double gscNegAlphaRadPerS, gscNegKp, gscNegKi, ddsrfFilterS;
    public final double mscAlphaRadPerS, mscKpD, mscKpQ, mscKi;
    // dc loop
    public final double dcKp, dcKi;
    // pll
    public final double pllKp, pllKi;
    // aerodynamics
    public final double cpMax, lambdaOpt, kOptRotorNmPerRad2S2, kOptGeneratorNmPerRad2S2;
    // pitch
    public final double pitchKp, pitchKi, pitchScheduleThetaKRad, pitchSensitivityAtZeroWPerRad, drivetrainInertiaKgM2;

    private ControllerTuning(TurbineParameters p, ControllerSettings s) {
        turbine = p;
        settings = s;
        gridOmegaRadPerS = 2.0 * Math.PI * p.gridFrequencyHz;
        gridVoltageBaseV = Math.sqrt(2.0) * p.lvVoltageV / Math.sqrt(3.0);
        gridCurrentBaseA = Math.sqrt(2.0) * p.converterRatedCurrentA;
        ratedGeneratorSpeedRadPerS = p.ratedRotorSpeedRadPerS * p.gearRatio;
        ratedTorqueNm = p.ratedPowerW / ratedGeneratorSpeedRadPerS;
        maxTorqueNm = 1.1 * ratedTorqueNm;
        statorCurrentBaseA = ratedTorqueNm / (1.5 * p.polePairs * p.magnetFluxWb);

        final double w = gridOmegaRadPerS;
        final double lv2 = p.lvVoltageV * p.lvVoltageV;
        double rBeyond = 0.0;
        double xBeyond = 0.0;
        final double zCt = p.converterTransformerShortCircuitPu * lv2 / p.converterTransformerRatingVA;
        rBeyond += resistance(zCt, p.converterTransformerXOverR);
        xBeyond += reactance(zCt, p.converterTransformerXOverR);
        final double zPt = p.plantTransformerShortCircuitPu * lv2 / p.plantTransformerRatingVA;
        rBeyond += resistance(zPt, p.plantTransformerXOverR);
        xBeyond += reactance(zPt, p.plantTransformerXOverR);
        final double zG = lv2 / (p.shortCircuitRatio * p.ratedPowerW);
        rBeyond += resistance(zG, p.gridXOverR);
        xBeyond += reactance(zG, p.gridXOverR);
        beyondTerminalResistanceOhm = rBeyond;
        beyondTerminalInductanceH = xBeyond / w;
        totalResistanceOhm = p.chokeResistanceOhm + rBeyond;
        totalInductanceH = p.chokeInductanceH + beyondTerminalInductanceH;

        gscAlphaRadPerS = LN9 / s.gscCurrentRiseTimeS;
        gscKp = imcKp(gscAlphaRadPerS, totalInductanceH);
        gscKi = imcKi(gscAlphaRadPerS, totalResistanceOhm);
        gscNegAlphaRadPerS = LN9 / (2.0 * s.gscCurrentRiseTimeS);
        gscNegKp = gscNegAlphaRadPerS * totalInductanceH;
        gscNegKi = 0.25 * gscNegAlphaRadPerS * gscNegAlphaRadPerS * totalInductanceH;
        ddsrfFilterS = Ddsrf.filterTimeConstantS(w);
        mscAlphaRadPerS = LN9 / s.mscCurrentRiseTimeS;
        mscKpD = imcKp(mscAlphaRadPerS, p.dAxisInductanceH);
        mscKpQ = imcKp(mscAlphaRadPerS, p.qAxisInductanceH);
        mscKi = imcKi(mscAlphaRadPerS, p.statorResistanceOhm);

        final double dcWn = 2.0 * Math.PI * s.dcNaturalFrequencyHz;
        final double vdc0 = s.dcVoltageRefPu * p.dcVoltageNominalV;
        dcKp = dcVoltageKp(dcWn, s.dcDampingRatio, p.dcCapacitanceF, vdc0, gridVoltageBaseV);
        dcKi = dcVoltageKi(dcWn, p.dcCapacitanceF, vdc0, gridVoltageBaseV);

        final double pllWn = 2.0 * Math.PI * s.pllNaturalFrequencyHz;
        pllKp = SrfPll.kpFor(pllWn, s.pllDampingRatio);
        pllKi = SrfPll.kiFor(pllWn);

        final double[] opt = Aerodynamics.optimum(p);
        lambdaOpt = opt[0];
        cpMax = opt[1];
        kOptRotorNmPerRad2S2 = optimalTorqueGain(p.airDensityKgPerM3, p.rotorRadiusM, cpMax, lambdaOpt);
        kOptGeneratorNmPerRad2S2 = kOptRotorNmPerRad2S2 / (p.gearRatio * p.gearRatio * p.gearRatio);

        drivetrainInertiaKgM2 = p.rotorInertiaKgM2 + p.gearRatio * p.gearRatio * p.generatorInertiaKgM2;
        final double[] sched = Aerodynamics.pitchSensitivity(p);
        pitchSensitivityAtZeroWPerRad = sched[0];
        pitchScheduleThetaKRad = sched[1];
        final double pitchWn = 2.0 * Math.PI * s.pitchNaturalFrequencyHz;
        pitchKp = pitchKp(drivetrainInertiaKgM2, p.ratedRotorSpeedRadPerS, p.gearRatio, sched[0],
                s.pitchDampingRatio, pitchWn);
        pitchKi = pitchKi(drivetrainInertiaKgM2, p.ratedRotorSpeedRadPerS, p.gearRatio, sched[0], pitchWn);
    }

    /** Derives all gains. */
    public static ControllerTuning derive(TurbineParameters turbine, ControllerSettings settings) {
        return new ControllerTuning(turbine, settings);
    }

    /** IMC proportional gain {@code alpha L} (ohm). */
    public static double imcKp(double alphaRadPerS, double inductanceH) {
        return alphaRadPerS * inductanceH;
    }

    /** IMC integral gain {@code alpha R} (ohm/s). */
    public static double imcKi(double alphaRadPerS, double resistanceOhm) {
        return alphaRadPerS * resistanceOhm;
    }

    /** DC-voltage loop proportional gain, A/V. */
    public static double dcVoltageKp(double wnRadPerS, double zeta, double capacitanceF, double vdc0V, double vgPeakV) {
        return 2.0 * zeta * wnRadPerS * capacitanceF * vdc0V / (1.5 * vgPeakV);
    }

    /** DC-voltage loop integral gain, A/(V s). */
    public static double dcVoltageKi(double wnRadPerS, double capacitanceF, double vdc0V, double vgPeakV) {
        return wnRadPerS * wnRadPerS * capacitanceF * vdc0V / (1.5 * vgPeakV);
    }

    /** MPPT gain on the rotor shaft, N m/(rad/s)^2. */
    public static double optimalTorqueGain(double rho, double radiusM, double cpMax, double lambdaOpt) {
        return 0.5 * rho * Math.PI * Math.pow(radiusM, 5) * cpMax / (lambdaOpt * lambdaOpt * lambdaOpt);
    }

    /** Pitch PI proportional gain at pitch 0, rad per (rad/s) of generator-speed error. */
    public static double pitchKp(double inertiaKgM2, double ratedRotorSpeedRadPerS, double gearRatio,
            double dPdThetaWPerRad, double zeta, double wnRadPerS) {
        return 2.0 * inertiaKgM2 * ratedRotorSpeedRadPerS * zeta * wnRadPerS / (gearRatio * -dPdThetaWPerRad);
    }

    /** Pitch PI integral gain at pitch 0, rad per rad of integrated generator-speed error. */
    public static double pitchKi(double inertiaKgM2, double ratedRotorSpeedRadPerS, double gearRatio,
            double dPdThetaWPerRad, double wnRadPerS) {
        return inertiaKgM2 * ratedRotorSpeedRadPerS * wnRadPerS * wnRadPerS / (gearRatio * -dPdThetaWPerRad);
    }

    private static double resistance(double z, double xOverR) {
        return z / Math.sqrt(1.0 + xOverR * xOverR);
    }

    private static double reactance(double z, double xOverR) {
        return z * xOverR / Math.sqrt(1.0 + xOverR * xOverR);
    }

    /** The gains as nested maps (the JSON of {@code galebench controller show}). */
    public Map<String, Object> toMap() {
        final Map<String, Object> root = new LinkedHashMap<>();
        final Map<String, Object> msc = new LinkedHashMap<>();
        final Map<String, Object> mscCurrent = new LinkedHashMap<>();
        mscCurrent.put("kp", mscKpQ);
        mscCurrent.put("ki", mscKi);
        mscCurrent.put("rise_time_s", settings.mscCurrentRiseTimeS);
        mscCurrent.put("r_ohm", turbine.statorResistanceOhm);
        mscCurrent.put("l_h", turbine.qAxisInductanceH);
        mscCurrent.put("kp_d", mscKpD);
        mscCurrent.put("l_d_h", turbine.dAxisInductanceH);
        mscCurrent.put("alpha_rad_s", mscAlphaRadPerS);
        msc.put("current", mscCurrent);
        final Map<String, Object> mppt = new LinkedHashMap<>();
        mppt.put("cp_max", cpMax);
        mppt.put("lambda_opt", lambdaOpt);
        mppt.put("k_opt_rotor_nm_s2", kOptRotorNmPerRad2S2);
        mppt.put("k_opt_generator_nm_s2", kOptGeneratorNmPerRad2S2);
        mppt.put("rated_torque_nm", ratedTorqueNm);
        mppt.put("stator_current_base_a", statorCurrentBaseA);
        msc.put("mppt", mppt);
        root.put("msc", msc);

        final Map<String, Object> gsc = new LinkedHashMap<>();
        final Map<String, Object> gscCurrent = new LinkedHashMap<>();
        gscCurrent.put("kp", gscKp);
        gscCurrent.put("ki", gscKi);
        gscCurrent.put("rise_time_s", settings.gscCurrentRiseTimeS);
        gscCurrent.put("r_ohm", totalResistanceOhm);
        gscCurrent.put("l_h", totalInductanceH);
        gscCurrent.put("alpha_rad_s", gscAlphaRadPerS);
        gscCurrent.put("choke_l_h", turbine.chokeInductanceH);
        gscCurrent.put("beyond_terminal_r_ohm", beyondTerminalResistanceOhm);
        gscCurrent.put("beyond_terminal_l_h", beyondTerminalInductanceH);
        gsc.put("current", gscCurrent);
        final Map<String, Object> gscNeg = new LinkedHashMap<>();
        gscNeg.put("kp", gscNegKp);
        gscNeg.put("ki", gscNegKi);
        gscNeg.put("alpha_rad_s", gscNegAlphaRadPerS);
        gscNeg.put("ddsrf_filter_s", ddsrfFilterS);
        gsc.put("negative_sequence_current", gscNeg);
        final Map<String, Object> dc = new LinkedHashMap<>();
        dc.put("kp", dcKp);
        dc.put("ki", dcKi);
        dc.put("natural_frequency_hz", settings.dcNaturalFrequencyHz);
        dc.put("damping_ratio", settings.dcDampingRatio);
        dc.put("capacitance_f", turbine.dcCapacitanceF);
        dc.put("reference_v", settings.dcVoltageRefPu * turbine.dcVoltageNominalV);
        gsc.put("dc_voltage", dc);
        final Map<String, Object> bases = new LinkedHashMap<>();
        bases.put("voltage_peak_v", gridVoltageBaseV);
        bases.put("current_peak_a", gridCurrentBaseA);
        gsc.put("base", bases);
        root.put("gsc", gsc);

        final Map<String, Object> pll = new LinkedHashMap<>();
        pll.put("kp", pllKp);
        pll.put("ki", pllKi);
        pll.put("natural_frequency_hz", settings.pllNaturalFrequencyHz);
        pll.put("damping_ratio", settings.pllDampingRatio);
        root.put("pll", pll);

        final Map<String, Object> pitch = new LinkedHashMap<>();
        pitch.put("kp", pitchKp);
        pitch.put("ki", pitchKi);
        pitch.put("theta_k_deg", Math.toDegrees(pitchScheduleThetaKRad));
        pitch.put("dp_dtheta_w_rad", pitchSensitivityAtZeroWPerRad);
        pitch.put("inertia_kg_m2", drivetrainInertiaKgM2);
        root.put("pitch", pitch);

        final Map<String, Object> frt = new LinkedHashMap<>();
        frt.put("k_factor", settings.kFactor);
        frt.put("negative_sequence_k", settings.negativeSequenceK);
        frt.put("enter_deviation_pu", settings.frtEnterPu);
        frt.put("exit_deviation_pu", settings.frtExitPu);
        frt.put("hold_s", settings.frtHoldS);
        frt.put("current_limit_pu", settings.gscCurrentLimitPu);
        frt.put("current_limit_frt_pu", settings.gscCurrentLimitFrtPu);
        frt.put("active_recovery_rate_pu_s", settings.activeRecoveryRatePuPerS);
        root.put("frt", frt);
        return root;
    }
}
