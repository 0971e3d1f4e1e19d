package dev.galebench.board.control;

import dev.galebench.board.BoardController;
import dev.galebench.plant.BoardCommand;
import dev.galebench.plant.SensorView;
import dev.galebench.plant.TurbineParameters;

/**
 * The known-good converter controller: machine side rotor-flux oriented with MPPT, grid side
 * voltage oriented with DC-voltage and reactive loops, current limiter, fault ride-through,
 * chopper, pitch and protection. Structure, equations and tuning: {@code io-bridge/CONTROLLER.md}
 * and {@link ControllerTuning}.
 *
 * <p>{@link #update} runs on the real-time thread in offline runs: it allocates nothing, takes
 * no lock, logs nothing and throws nothing; all state is primitive fields and a few small
 * helper objects built in the constructor.
 *
 * <p>Conventions: amplitude-invariant Park with q leading d ({@link Transforms}); grid current
 * positive towards the grid, so P = 1.5 v_d i_d and, voltage oriented (v_q = 0),
 * Q = -1.5 v_d i_q: capacitive (voltage-supporting) reactive current is {@code -i_q}.
 * Generator currents in generator convention. Per unit: grid voltages of the nominal LV peak
 * phase voltage, grid currents of the converter's rated peak current.
 *
 * <p>Negative sequence: grid voltage and grid current are split into sequences by a DDSRF
 * ({@link Ddsrf}); the PLL locks on the positive-sequence voltage, the positive-sequence loops
 * regulate the decoupled positive-sequence current, and a second pair of PI loops in the frame
 * at {@code -theta} regulates the negative-sequence current: zero outside FRT, during FRT
 * {@code k2 (u2 - u2_0)} lagging the negative-sequence voltage by 90 degrees seen from the grid
 * (VDE-AR-N 4120 style). The limiter gives the positive sequence priority and the negative
 * sequence what is left of the FRT limit, so {@code |i+| + |i-|}, a bound of every phase peak,
 * stays within it. Equations: {@code io-bridge/CONTROLLER.md}, "Negative sequence".
 */
public final class ReferenceController implements BoardController {
    /** Trip causes (bits of {@link #tripCause()}). */
    public static final int CAUSE_UNDERVOLTAGE = 1;
    public static final int CAUSE_OVERVOLTAGE = 1 << 1;
    public static final int CAUSE_GSC_OVERCURRENT = 1 << 2;
    public static final int CAUSE_MSC_OVERCURRENT = 1 << 3;
    public static final int CAUSE_DC_OVERVOLTAGE = 1 << 4;
    public static final int CAUSE_PLANT_TRIP = 1 << 5;

    /** Operating states (see {@link #state()}). */
    public static final int STATE_RUNNING = 0;
    public static final int STATE_STOPPED_LOW_WIND = 1;
    public static final int STATE_STOPPED_HIGH_WIND = 2;
    public static final int STATE_TRIPPED = 3;

    private final ControllerTuning tuning;

    // ---- constants copied from the tuning (primitives for the hot path)
    private final double vBase, iBase, omegaNom, vdcRef, vdcNom;
    private final double rTot, lTot, rBeyond, lBeyond;
    private final double rs, ld, lq, psi, polePairs, statorBase, mscLimitA;
    private final double kOptGen, ratedGenSpeed, ratedPower, maxTorque, transitionSpeed, minGenSpeed;
    private final double pitchKp, pitchKi, pitchThetaK, pitchMin, pitchMax, pitchRate;
    private final double kNeg, gscNegKp, gscNegKi;
    private final double kFactor, kVoltage, limitNormal, limitFrt, recoveryRate, modLimit;
    private final double chopperOnV, chopperOffV;
    private final double uvPu, uvFastPu, ovPu, ovFastPu, gscOcA, mscOcA, dcOvV;
    private final double cutIn, cutOut, restartHyst, cutInDelay, cutOutDelay;

    // ---- helpers
    private final SrfPll pll = new SrfPll();
    private final PiRegulator gscPiD = new PiRegulator();
    private final PiRegulator gscPiQ = new PiRegulator();
    private final PiRegulator gscNegPiD = new PiRegulator();
    private final PiRegulator gscNegPiQ = new PiRegulator();
    private final Ddsrf voltageSeq = new Ddsrf();
    private final Ddsrf currentSeq = new Ddsrf();
    private final LowPass preFaultNegVoltage = new LowPass();
    private final MovingAverage negVoltageMeanD = new MovingAverage();
    private final MovingAverage negVoltageMeanQ = new MovingAverage();
    private final PiRegulator dcPi = new PiRegulator();
    private final PiRegulator mscPiD = new PiRegulator();
    private final PiRegulator mscPiQ = new PiRegulator();
    private final LowPass vdcFilter = new LowPass();
    private final LowPass voltageFilter = new LowPass();
    private final LowPass preFaultVoltage = new LowPass();
    private final LowPass ffD = new LowPass();
    private final LowPass ffQ = new LowPass();
    private final LowPass mscPowerFilter = new LowPass();
    private final LowPass speedFilter = new LowPass();
    private final LowPass windFilter = new LowPass();
    private final LowPass reactiveMean = new LowPass();
    private final CurrentLimiter limiter = new CurrentLimiter();
    private final FrtSupervisor frt = new FrtSupervisor();
    private final DelayRelay uvRelay = new DelayRelay();
    private final DelayRelay uvFastRelay = new DelayRelay();
    private final DelayRelay ovRelay = new DelayRelay();
    private final DelayRelay ovFastRelay = new DelayRelay();
    private final DelayRelay gscOcRelay = new DelayRelay();
    private final DelayRelay mscOcRelay = new DelayRelay();
    private final DelayRelay dcOvRelay = new DelayRelay();
    private final DelayRelay cutOutRelay = new DelayRelay();
    private final DelayRelay cutInRelay = new DelayRelay();
    private final DelayRelay restartRelay = new DelayRelay();

    // ---- state
    private double ts = 50e-6;
    private double angleAdvanceS;
    private double prevIAlpha, prevIBeta;
    private double pitchIntegral, pitchCmdRad;
    private boolean frtWasActive;
    private double reactivePreFaultPu;
    private double pllOffsetCos = 1.0, pllOffsetSin;
    private double activeCapPu;
    private boolean chopperOn;
    private int state;
    private int tripCause;
    private double lastMscVd, lastMscVq;
    private double mscPowerW;
    private double mscTorqueRefNm;

    // ---- observables (for tests, bring-up and the recorder)
    private double negDRefPu, negQRefPu, negDPu, negQPu, negVoltagePu;
    private double idRefPu, iqRefPu, idPu, iqPu, voltagePu, voltageRefPu, mscIdA, mscIqA, mscIdRefA, mscIqRefA;

    // ---- bring-up overrides (NaN = off)
    private double overrideGscIqPu = Double.NaN;
    private double overrideMscIdA = Double.NaN;

    /** The reference controller for the shipped default turbine and default controller settings. */
    public static ReferenceController withDefaults() {
        return new ReferenceController(dev.galebench.plant.TurbineFile.defaults(), ControllerFile.defaults());
    }

    /** Controller for a turbine with the given settings. */
    public ReferenceController(TurbineParameters turbine, ControllerSettings settings) {
        this(ControllerTuning.derive(turbine, settings));
    }

    public ReferenceController(ControllerTuning t) {
        tuning = t;
        final TurbineParameters p = t.turbine;
        final ControllerSettings s = t.settings;
        vBase = t.gridVoltageBaseV;
        iBase = t.gridCurrentBaseA;
        omegaNom = t.gridOmegaRadPerS;
        vdcNom = p.dcVoltageNominalV;
        vdcRef = s.dcVoltageRefPu * p.dcVoltageNominalV;
        rTot = t.totalResistanceOhm;
        lTot = t.totalInductanceH;
        rBeyond = t.beyondTerminalResistanceOhm;
        lBeyond = t.beyondTerminalInductanceH;
        rs = p.statorResistanceOhm;
        ld = p.dAxisInductanceH;
        lq = p.qAxisInductanceH;
        psi = p.magnetFluxWb;
        polePairs = p.polePairs;
        statorBase = t.statorCurrentBaseA;
        mscLimitA = s.mscCurrentLimitPu * t.statorCurrentBaseA;
        kOptGen = t.kOptGeneratorNmPerRad2S2;
        ratedGenSpeed = t.ratedGeneratorSpeedRadPerS;
        ratedPower = p.ratedPowerW;
        maxTorque = t.maxTorqueNm;
        transitionSpeed = s.torqueTransitionSpeedPu * t.ratedGeneratorSpeedRadPerS;
        minGenSpeed = p.minRotorSpeedRadPerS * p.gearRatio;
        pitchKp = t.pitchKp;
        pitchKi = t.pitchKi;
        pitchThetaK = t.pitchScheduleThetaKRad;
        pitchMin = p.pitchMinRad;
        pitchMax = p.pitchMaxRad;
        pitchRate = p.pitchRateMaxRadPerS;
        kFactor = s.kFactor;
        kNeg = s.negativeSequenceK;
        gscNegKp = t.gscNegKp;
        gscNegKi = t.gscNegKi;
        kVoltage = s.voltageLoopGainPu;
        limitNormal = s.gscCurrentLimitPu;
        limitFrt = s.gscCurrentLimitFrtPu;
        recoveryRate = s.activeRecoveryRatePuPerS;
        modLimit = s.modulationLimitPu;
        chopperOnV = s.chopperOnPu * vdcNom;
        chopperOffV = s.chopperOffPu * vdcNom;
        uvPu = s.undervoltagePu;
        uvFastPu = s.undervoltageFastPu;
        ovPu = s.overvoltagePu;
        ovFastPu = s.overvoltageFastPu;
        gscOcA = s.overcurrentPu * p.gscCurrentTripA;
        mscOcA = s.overcurrentPu * p.mscCurrentTripA;
        dcOvV = s.dcOvervoltagePu * p.dcOvervoltageTripV;
        cutIn = p.cutInWindMPerS;
        cutOut = p.cutOutWindMPerS;
        restartHyst = s.restartHysteresisMPerS;
        cutInDelay = s.cutInDelayS;
        cutOutDelay = s.cutOutDelayS;
        setSamplePeriod(ts);
    }

    /** The gains this controller runs with. */
    public ControllerTuning tuning() {
        return tuning;
    }

    @Override
    public void setSamplePeriod(double samplePeriodS) {
        ts = samplePeriodS;
        final ControllerTuning t = tuning;
        final ControllerSettings s = t.settings;
        pll.configure(t.pllKp, t.pllKi, t.turbine.gridFrequencyHz, s.pllNormFloorPu * vBase, ts);
        gscPiD.setGains(t.gscKp, t.gscKi);
        gscPiQ.setGains(t.gscKp, t.gscKi);
        gscNegPiD.setGains(gscNegKp, gscNegKi);
        gscNegPiQ.setGains(gscNegKp, gscNegKi);
        voltageSeq.configure(t.ddsrfFilterS, ts);
        currentSeq.configure(t.ddsrfFilterS, ts);
        preFaultNegVoltage.configure(s.voltageReferenceFilterS, ts);
        negVoltageMeanD.configure(0.5 / t.turbine.gridFrequencyHz, ts);
        negVoltageMeanQ.configure(0.5 / t.turbine.gridFrequencyHz, ts);
        dcPi.setGains(t.dcKp, t.dcKi);
        dcPi.setLimits(-limitFrt * iBase * 2.0, limitFrt * iBase * 2.0);
        mscPiD.setGains(t.mscKpD, t.mscKi);
        mscPiQ.setGains(t.mscKpQ, t.mscKi);
        vdcFilter.configure(s.dcVoltageFilterS, ts);
        voltageFilter.configure(s.voltageFilterS, ts);
        preFaultVoltage.configure(s.voltageReferenceFilterS, ts);
        ffD.configure(s.feedForwardFilterS, ts);
        ffQ.configure(s.feedForwardFilterS, ts);
        mscPowerFilter.configure(0.002, ts);
        speedFilter.configure(s.speedFilterS, ts);
        windFilter.configure(s.windFilterS, ts);
        reactiveMean.configure(0.1, ts);
        // the measured phase quantities lag by the known anti-alias filter of the front end
        // (turbine file, measurement.voltage_filter_s): the output angle is advanced by it too
        angleAdvanceS = s.angleAdvanceSamples * ts + t.turbine.voltageFilterTimeConstantS;
        frt.configure(s.frtEnterPu, s.frtExitPu, s.frtHoldS);
        uvRelay.configure(s.undervoltageDelayS);
        uvFastRelay.configure(s.undervoltageFastDelayS);
        ovRelay.configure(s.overvoltageDelayS);
        ovFastRelay.configure(s.overvoltageFastDelayS);
        gscOcRelay.configure(s.overcurrentDelayS);
        mscOcRelay.configure(s.overcurrentDelayS);
        dcOvRelay.configure(s.dcOvervoltageDelayS);
        cutOutRelay.configure(cutOutDelay);
        cutInRelay.configure(cutInDelay);
        restartRelay.configure(cutInDelay);
    }

    @Override
    public void start(SensorView in) {
        // ---- grid side
        final double va = Transforms.alpha(in.gridVoltageAV, in.gridVoltageBV, in.gridVoltageCV);
        final double vb = Transforms.beta(in.gridVoltageBV, in.gridVoltageCV);
        final double ia = Transforms.alpha(in.gridCurrentAA, in.gridCurrentBA, in.gridCurrentCA);
        final double ib = Transforms.beta(in.gridCurrentBA, in.gridCurrentCA);
        pll.start(va, vb);
        final double c = pll.cos();
        final double s = pll.sin();
        final double vd = Transforms.d(va, vb, c, s);
        final double vq = Transforms.q(va, vb, c, s);
        final double id = Transforms.d(ia, ib, c, s);
        final double iq = Transforms.q(ia, ib, c, s);
        voltageSeq.start(va, vb, c, s);
        currentSeq.start(ia, ib, c, s);
        gscNegPiD.resetTo(0.0);
        gscNegPiQ.resetTo(0.0);
        preFaultNegVoltage.reset(0.0);
        negVoltageMeanD.reset(0.0);
        negVoltageMeanQ.reset(0.0);
        negVoltagePu = 0.0;
        negDRefPu = negQRefPu = negDPu = negQPu = 0.0;
        // grid EMF estimate at steady state: e = v - (R + j w L) i beyond the terminal
        final double w = omegaNom;
        ffD.reset(vd - rBeyond * id + w * lBeyond * iq);
        ffQ.reset(vq - rBeyond * iq - w * lBeyond * id);
        final double rot = w * ts;
        prevIAlpha = ia * Math.cos(rot) + ib * Math.sin(rot);
        prevIBeta = -ia * Math.sin(rot) + ib * Math.cos(rot);
        gscPiD.resetTo(rTot * id);
        gscPiQ.resetTo(rTot * iq);
        final double u = Math.sqrt(va * va + vb * vb) / vBase;
        voltageFilter.reset(u);
        preFaultVoltage.reset(u);
        voltagePu = u;
        vdcFilter.reset(in.dcLinkVoltageV);
        frt.reset();
        frtWasActive = false;
        reactiveMean.reset(-iq / iBase);
        activeCapPu = limitFrt;
        chopperOn = false;
        idPu = id / iBase;
        iqPu = iq / iBase;

        // ---- machine side
        final double thetaE = polePairs * in.rotorAngleRad;
        final double ce = Math.cos(thetaE);
        final double se = Math.sin(thetaE);
        final double sa = Transforms.alpha(in.statorCurrentAA, in.statorCurrentBA, in.statorCurrentCA);
        final double sb = Transforms.beta(in.statorCurrentBA, in.statorCurrentCA);
        final double isd = Transforms.d(sa, sb, ce, se);
        final double isq = Transforms.q(sa, sb, ce, se);
        final double we = polePairs * in.rotorSpeedRadPerS;
        mscPiD.resetTo(rs * isd);
        mscPiQ.resetTo(rs * isq);
        lastMscVd = -rs * isd + we * lq * isq;
        lastMscVq = -rs * isq - we * ld * isd + we * psi;
        mscPowerW = 1.5 * (lastMscVd * isd + lastMscVq * isq);
        mscPowerFilter.reset(mscPowerW);
        speedFilter.reset(in.rotorSpeedRadPerS);
        windFilter.reset(in.windSpeedMPerS);
        mscIdA = isd;
        mscIqA = isq;

        // ---- DC loop: output equals the measured active current
        final double ff = mscPowerW / (1.5 * Math.max(vd, 0.2 * vBase));
        dcPi.resetTo(id - ff);

        // ---- pitch: command equals the measured pitch
        pitchCmdRad = in.pitchAngleRad;
        final double gk = 1.0 / (1.0 + Math.max(0.0, pitchCmdRad) / pitchThetaK);
        pitchIntegral = pitchCmdRad / (gk * pitchKi);

        uvRelay.reset();
        uvFastRelay.reset();
        ovRelay.reset();
        ovFastRelay.reset();
        gscOcRelay.reset();
        mscOcRelay.reset();
        dcOvRelay.reset();
        cutOutRelay.reset();
        cutInRelay.reset();
        restartRelay.reset();
        tripCause = 0;
        if (in.windSpeedMPerS > cutOut) {
            state = STATE_STOPPED_HIGH_WIND;
        } else if (in.windSpeedMPerS < cutIn) {
            state = STATE_STOPPED_LOW_WIND;
        } else {
            state = STATE_RUNNING;
        }
    }

    @Override
    public void update(SensorView in, BoardCommand out) {
        final double h = ts;
        // ================= measurements
        final double vdc = vdcFilter.step(in.dcLinkVoltageV);
        final double va = Transforms.alpha(in.gridVoltageAV, in.gridVoltageBV, in.gridVoltageCV);
        final double vb = Transforms.beta(in.gridVoltageBV, in.gridVoltageCV);
        final double ia = Transforms.alpha(in.gridCurrentAA, in.gridCurrentBA, in.gridCurrentCA);
        final double ib = Transforms.beta(in.gridCurrentBA, in.gridCurrentCA);
        final double c = pll.cos();
        final double s = pll.sin();
        // sequence separation (DDSRF): positive sequence decoupled from the 2f ripple of the
        // negative sequence; on a balanced grid these are the plain Park components
        voltageSeq.step(va, vb, c, s);
        currentSeq.step(ia, ib, c, s);
        final double vd = voltageSeq.posD;
        final double vq = voltageSeq.posQ;
        final double id = currentSeq.posD;
        final double iq = currentSeq.posQ;
        final double c2 = c * c - s * s;
        final double s2 = 2.0 * s * c;
        final double vnD = voltageSeq.negDBar();
        final double vnQ = voltageSeq.negQBar();
        final double inD = currentSeq.negDBar();
        final double inQ = currentSeq.negQBar();
        final double omega = pll.omegaRadPerS();
        // grid EMF behind the transformers and the grid equivalent, from the measured voltage
        final double ea = va - rBeyond * ia - lBeyond * (ia - prevIAlpha) / h;
        final double eb = vb - rBeyond * ib - lBeyond * (ib - prevIBeta) / h;
        prevIAlpha = ia;
        prevIBeta = ib;
        final double ed = ffD.step(Transforms.d(ea, eb, c, s));
        final double eq = ffQ.step(Transforms.q(ea, eb, c, s));
        final double u = voltageFilter.step(Math.sqrt(vd * vd + vq * vq) / vBase);
        voltagePu = u;
        // negative-sequence voltage for the reference: the DDSRF output averaged over half a
        // period. A balanced step leaves a decaying 2f transient in the DDSRF's negative sequence
        // (its decoupling needs the filtered positive sequence, which lags): the average removes
        // it, so a balanced dip asks for no negative-sequence current; a real one is constant here.
        final double vnRefD = negVoltageMeanD.step(vnD);
        final double vnRefQ = negVoltageMeanQ.step(vnQ);
        final double vnMag = Math.sqrt(vnRefD * vnRefD + vnRefQ * vnRefQ);
        final double u2 = vnMag / vBase;
        negVoltagePu = u2;

        // ================= fault ride-through
        final double u0 = preFaultVoltage.value();
        final boolean frtActive = frt.step(u - u0, h);
        // PLL input. Normal: the terminal voltage. During FRT the terminal voltage is largely
        // made by the converter's own reactive current through the transformers and the grid
        // (a 0.05 pu dip leaves about 0.3 pu at the terminal): locking on it is a positive
        // feedback that drags the angle away. So during FRT the PLL follows the estimated grid
        // EMF, turned by the pre-fault angle between terminal voltage and EMF: it still follows
        // a phase jump of the grid, but not its own current.
        if (frtActive && !frtWasActive) {
            final double emfAngle = Math.atan2(eq, ed); // EMF angle in the (pre-fault) PLL frame
            pllOffsetCos = Math.cos(-emfAngle);
            pllOffsetSin = Math.sin(-emfAngle);
            // pre-fault reactive current: a 0.1 s mean, so the voltage loop's reaction to the
            // first milliseconds of the dip (before detection) is not counted as pre-fault
            reactivePreFaultPu = reactiveMean.value();
        }
        // the PLL locks on the positive sequence: the negative-sequence estimate is taken off
        // its input (for the EMF: E- = V- - (R - j w L) I- in the frame at -theta)
        if (frtActive) {
            final double enD = vnD - rBeyond * inD - omega * lBeyond * inQ;
            final double enQ = vnQ - rBeyond * inQ + omega * lBeyond * inD;
            final double epa = ea - Ddsrf.negAlpha(enD, enQ, c, s);
            final double epb = eb - Ddsrf.negBeta(enD, enQ, c, s);
            pll.step(epa * pllOffsetCos - epb * pllOffsetSin, epa * pllOffsetSin + epb * pllOffsetCos);
        } else {
            pll.step(va - Ddsrf.negAlpha(vnD, vnQ, c, s), vb - Ddsrf.negBeta(vnD, vnQ, c, s));
            preFaultVoltage.step(u);
            preFaultNegVoltage.step(u2);
        }
        frtWasActive = frtActive;

        // ================= reactive reference (capacitive positive, pu)
        double reactivePu;
        if (frtActive) {
            reactivePu = reactivePreFaultPu + kFactor * (u0 - u);
        } else {
            voltageRefPu = u0 + in.voltageDeviationRefPu;
            reactivePu = kVoltage * (voltageRefPu - u);
        }
        if (!Double.isNaN(overrideGscIqPu)) {
            reactivePu = -overrideGscIqPu;
        }
        if (!frtActive) {
            reactiveMean.step(reactivePu);
        }

        // ================= DC-voltage loop -> active current
        final double dcErr = vdc - vdcRef;
        final double pMsc = mscPowerFilter.step(mscPowerW);
        // power-balance feed-forward: the active current that carries the machine-side power
        // out, with the q-axis term (v_q i_q is not zero while the PLL tracks a phase shift)
        final double idFf = (pMsc - 1.5 * vq * iqRefPu * iBase) / (1.5 * Math.max(vd, 0.2 * vBase));
        final double dcIntegralBefore = dcPi.integral();
        final double idWantA = dcPi.step(dcErr, h, false) + idFf;
        final double limit = frtActive ? limitFrt : limitNormal;
        // active-current cap: rises at the recovery rate, pulled down to the active current
        // actually granted while FRT is active (so the recovery ramp starts from there)
        final double cap = Math.min(limit, activeCapPu + recoveryRate * h);
        limiter.limit(idWantA / iBase, -reactivePu, limit, frtActive, cap);
        if (limiter.dClipped && ((limiter.idPu < idWantA / iBase) == (dcErr > 0.0))) {
            dcPi.resetTo(dcIntegralBefore);
        }
        activeCapPu = frtActive ? Math.abs(limiter.idPu) : cap;
        idRefPu = limiter.idPu;
        iqRefPu = limiter.iqPu;
        idPu = id / iBase;
        iqPu = iq / iBase;

        // ================= negative-sequence reference (frame at -theta, pu)
        // FRT: |i2| = k2 (u2 - u2_0), lagging the negative-sequence voltage by 90 degrees seen
        // from the grid (current towards the grid leads it: i2 = -j |i2| v2/|v2| in this frame),
        // so the drop over the grid impedance lowers u2. Outside FRT: 0 (balanced currents).
        // Limiter: the positive sequence keeps its limited reference; the negative sequence gets
        // what is left, |i2| <= I_max - |i1|, so every phase peak (<= |i1| + |i2|) is within I_max.
        double i2Mag = 0.0;
        if (frtActive && kNeg > 0.0 && u2 > 0.005) {
            final double du2 = u2 - preFaultNegVoltage.value();
            i2Mag = du2 > 0.0 ? kNeg * du2 : 0.0;
            final double room = limit - Math.sqrt(idRefPu * idRefPu + iqRefPu * iqRefPu);
            if (i2Mag > room) {
                i2Mag = room > 0.0 ? room : 0.0;
            }
        }
        if (i2Mag > 0.0) {
            negDRefPu = i2Mag * vnRefQ / vnMag;
            negQRefPu = -i2Mag * vnRefD / vnMag;
        } else {
            negDRefPu = 0.0;
            negQRefPu = 0.0;
        }
        negDPu = inD / iBase;
        negQPu = inQ / iBase;

        // ================= grid-side current loops (IMC), converter voltage reference
        final double idRefA = idRefPu * iBase;
        final double iqRefA = iqRefPu * iBase;
        final double intD = gscPiD.integral();
        final double intQ = gscPiQ.integral();
        // positive-sequence feedback: the Park current less the negative-sequence *reference*
        // seen in this frame (X- e^{-j2theta}); with i2* = 0 it is the plain Park current, so a
        // balanced grid sees exactly the positive-sequence loops as before
        final double nRefDA = negDRefPu * iBase;
        final double nRefQA = negQRefPu * iBase;
        final double idFb = Transforms.d(ia, ib, c, s) - (nRefDA * c2 + nRefQA * s2);
        final double iqFb = Transforms.q(ia, ib, c, s) - (nRefQA * c2 - nRefDA * s2);
        double vcd = ed + gscPiD.step(idRefA - idFb, h, false) - omega * lTot * iqFb;
        double vcq = eq + gscPiQ.step(iqRefA - iqFb, h, false) + omega * lTot * idFb;
        final double vmax = modLimit * vdc * Transforms.INV_SQRT3;
        final double vmag = Math.sqrt(vcd * vcd + vcq * vcq);
        if (vmag > vmax) {
            // Over the modulation limit. Normally the vector is scaled back (angle kept).
            // During FRT with capacitive current the d component is kept and q gets what is
            // left: at the voltage recovery after a deep dip the capacitive current still
            // flows and v_d = e_d - w L i_q is out of reach; a shortfall of v_d drives i_d down at
            // once (L di_d/dt = v_d - e_d + w L i_q), so scaling would reverse the active current
            // and charge the DC link from the grid (tested: DC trip at 0.05 pu dip recovery).
            // In a swell (inductive current) scaling is the better choice: it keeps the angle
            // that lets the absorbed current build up.
            if (frtActive && iqRefPu < 0.0) {
                vcd = vcd > vmax ? vmax : (vcd < -vmax ? -vmax : vcd);
                final double room = Math.sqrt(vmax * vmax - vcd * vcd);
                vcq = vcq > room ? room : (vcq < -room ? -room : vcq);
            } else {
                final double k = vmax / vmag;
                vcd *= k;
                vcq *= k;
            }
            gscPiD.resetTo(intD);
            gscPiQ.resetTo(intQ);
        }
        // negative-sequence current loop (PI in the frame at -theta on the DDSRF-filtered current;
        // cross coupling of that frame: L di/dt - j w L i). Its voltage adds to the positive-sequence
        // one; it gets the modulation reach the positive sequence leaves: when the instantaneous
        // sum |v+ + v- e^{-j2theta}| (positive frame) would exceed the limit, the negative part is
        // scaled to reach it exactly (positive sequence first).
        // The loop runs during FRT only. Outside FRT it is off (integrators at 0) and the
        // negative-sequence current stays small as before, open loop: the grid-EMF feed-forward
        // carries the grid's negative-sequence voltage, so the converter reproduces it. Why off:
        // a balanced step leaves a 2f transient in the DDSRF's filtered current, and a loop
        // acting on it changes the tuned positive-sequence step response (tested: 9 % overshoot).
        final double negIntD = gscNegPiD.integral();
        final double negIntQ = gscNegPiQ.integral();
        double vnCd = 0.0;
        double vnCq = 0.0;
        if (frtActive) {
            vnCd = gscNegPiD.step(negDRefPu * iBase - inD, h, false) + omega * lTot * inQ;
            vnCq = gscNegPiQ.step(negQRefPu * iBase - inQ, h, false) - omega * lTot * inD;
        } else {
            gscNegPiD.resetTo(0.0);
            gscNegPiQ.resetTo(0.0);
        }
        final double nPd = vnCd * c2 + vnCq * s2;
        final double nPq = vnCq * c2 - vnCd * s2;
        final double sd = vcd + nPd;
        final double sq = vcq + nPq;
        if (sd * sd + sq * sq > vmax * vmax) {
            // |p + k n|^2 = vmax^2, k in [0, 1]
            final double nn = nPd * nPd + nPq * nPq;
            final double pn = vcd * nPd + vcq * nPq;
            final double pp = vcd * vcd + vcq * vcq;
            final double disc = pn * pn - nn * (pp - vmax * vmax);
            double k = disc > 0.0 && nn > 0.0 ? (-pn + Math.sqrt(disc)) / nn : 0.0;
            k = k < 0.0 ? 0.0 : (k > 1.0 ? 1.0 : k);
            vnCd *= k;
            vnCq *= k;
            gscNegPiD.resetTo(negIntD);
            gscNegPiQ.resetTo(negIntQ);
        }

        // ================= machine side
        final double wg = speedFilter.step(in.rotorSpeedRadPerS);
        final double wind = windFilter.step(in.windSpeedMPerS);
        final double thetaE = polePairs * in.rotorAngleRad;
        final double ce = Math.cos(thetaE);
        final double se = Math.sin(thetaE);
        final double sa = Transforms.alpha(in.statorCurrentAA, in.statorCurrentBA, in.statorCurrentCA);
        final double sb = Transforms.beta(in.statorCurrentBA, in.statorCurrentCA);
        final double isd = Transforms.d(sa, sb, ce, se);
        final double isq = Transforms.q(sa, sb, ce, se);
        mscIdA = isd;
        mscIqA = isq;
        final double we = polePairs * in.rotorSpeedRadPerS;

        // ================= wind states and protection
        updateWindState(wind, h);
        protection(in, u, vdc, h);
        final boolean running = state == STATE_RUNNING;
        final boolean tripped = state == STATE_TRIPPED;

        // stopping (cut-out, low wind): the blades feather at their rate limit while the machine
        // side keeps the torque law, so the rotor slows down instead of running away; the
        // machine side blocks once the speed is below the minimum operating speed
        final boolean mscOn = !tripped && (running || wg > minGenSpeed);
        double torque = mscOn ? torqueReference(wg) : 0.0;
        mscTorqueRefNm = torque;
        double isdRef = 0.0;
        double isqRef;
        final double dL = lq - ld;
        if (Math.abs(dL) > 1e-6 * lq && dL > 0.0) {
            isqRef = torque / (1.5 * polePairs * psi);
            for (int k = 0; k < 4; k++) {
                final double a = psi / (2.0 * dL);
                isdRef = a - Math.sqrt(a * a + isqRef * isqRef);
                isqRef = torque / (1.5 * polePairs * (psi - dL * isdRef));
            }
        } else {
            isqRef = torque / (1.5 * polePairs * psi);
        }
        if (!Double.isNaN(overrideMscIdA)) {
            isdRef = overrideMscIdA;
        }
        final double imag = Math.sqrt(isdRef * isdRef + isqRef * isqRef);
        if (imag > mscLimitA) {
            final double k = mscLimitA / imag;
            isdRef *= k;
            isqRef *= k;
        }
        mscIdRefA = isdRef;
        mscIqRefA = isqRef;
        final double mIntD = mscPiD.integral();
        final double mIntQ = mscPiQ.integral();
        double vsd = -mscPiD.step(isdRef - isd, h, false) + we * lq * isq;
        double vsq = -mscPiQ.step(isqRef - isq, h, false) - we * ld * isd + we * psi;
        final double vsmag = Math.sqrt(vsd * vsd + vsq * vsq);
        if (vsmag > vmax) {
            final double k = vmax / vsmag;
            vsd *= k;
            vsq *= k;
            mscPiD.resetTo(mIntD);
            mscPiQ.resetTo(mIntQ);
        }
        if (!mscOn) {
            // blocked: keep integrators at the no-current state so a restart is bumpless
            mscPiD.resetTo(rs * isd);
            mscPiQ.resetTo(rs * isq);
        }
        lastMscVd = vsd;
        lastMscVq = vsq;
        mscPowerW = mscOn ? 1.5 * (vsd * isd + vsq * isq) : 0.0;

        // ================= pitch
        pitchControl(wg, h, running);

        // ================= chopper
        // on the unfiltered measurement: the chopper is the fast protection of the DC link
        final double vdcRaw = in.dcLinkVoltageV;
        if (vdcRaw > chopperOnV) {
            chopperOn = true;
        } else if (vdcRaw < chopperOffV) {
            chopperOn = false;
        }

        // ================= outputs
        if (tripped) {
            out.mscDutyA = out.mscDutyB = out.mscDutyC = 0.5;
            out.gscDutyA = out.gscDutyB = out.gscDutyC = 0.5;
            out.commandFlags = 0;
        } else {
            // angle advance for the delay between sampling and the mean of the applied voltage
            // (a few hundredths of a radian: the series to the cubic term is exact to 1e-9)
            final double adv = omega * angleAdvanceS;
            final double cAdv = 1.0 - 0.5 * adv * adv;
            final double sAdv = adv - adv * adv * adv * (1.0 / 6.0);
            final double ca = c * cAdv - s * sAdv;
            final double sn = s * cAdv + c * sAdv;
            // negative sequence turns the other way: e^{-j(theta + adv)}
            writeDuties(Transforms.alphaOf(vcd, vcq, ca, sn) + Ddsrf.negAlpha(vnCd, vnCq, ca, sn),
                    Transforms.betaOf(vcd, vcq, ca, sn) + Ddsrf.negBeta(vnCd, vnCq, ca, sn), vdc, out, true);
            final double advE = we * angleAdvanceS;
            final double cAdvE = 1.0 - 0.5 * advE * advE;
            final double sAdvE = advE - advE * advE * advE * (1.0 / 6.0);
            final double cm = ce * cAdvE - se * sAdvE;
            final double sm = se * cAdvE + ce * sAdvE;
            writeDuties(Transforms.alphaOf(vsd, vsq, cm, sm), Transforms.betaOf(vsd, vsq, cm, sm), vdc, out, false);
            if (!mscOn) {
                out.mscDutyA = out.mscDutyB = out.mscDutyC = 0.5;
            }
            out.commandFlags = BoardCommand.CMD_GSC_ENABLE | BoardCommand.CMD_BREAKER_CLOSE
                    | (mscOn ? BoardCommand.CMD_MSC_ENABLE : 0);
        }
        out.chopperDuty = chopperOn ? 1.0 : 0.0;
        out.pitchRefRad = pitchCmdRad;
        int status = 0;
        if (!tripped) {
            status |= BoardCommand.BOARD_RUNNING;
        } else {
            status |= BoardCommand.BOARD_TRIPPED;
        }
        if (frtActive) {
            status |= BoardCommand.BOARD_FRT_ACTIVE;
        }
        if (pitchCmdRad > pitchMin + 1.0e-3) {
            status |= BoardCommand.BOARD_PITCH_ACTIVE;
        }
        if (chopperOn) {
            status |= BoardCommand.BOARD_CHOPPER_ON;
        }
        if (pll.locked()) {
            status |= BoardCommand.BOARD_PLL_LOCKED;
        }
        out.boardStatus = status;
    }

    /** Generator torque law: k_opt w^2, a linear ramp to rated torque near rated speed, then constant power. */
    double torqueReference(double wg) {
        final double ws = transitionSpeed;
        final double wr = ratedGenSpeed;
        final double ratedTorque = ratedPower / wr;
        double t;
        if (wg <= ws) {
            t = kOptGen * wg * wg;
        } else if (wg < wr) {
            final double ts0 = kOptGen * ws * ws;
            t = ts0 + (ratedTorque - ts0) * (wg - ws) / (wr - ws);
        } else {
            t = ratedPower / wg;
        }
        final double powerCap = ratedPower / Math.max(wg, 1e-3);
        if (t > powerCap) {
            t = powerCap;
        }
        if (t > maxTorque) {
            t = maxTorque;
        }
        return t < 0.0 ? 0.0 : t;
    }

    private void pitchControl(double wg, double h, boolean running) {
        double cmd;
        if (running) {
            final double err = wg - ratedGenSpeed;
            final double gk = 1.0 / (1.0 + Math.max(0.0, pitchCmdRad) / pitchThetaK);
            pitchIntegral += err * h;
            final double iMin = pitchMin / (gk * pitchKi);
            final double iMax = pitchMax / (gk * pitchKi);
            if (pitchIntegral < iMin) {
                pitchIntegral = iMin;
            } else if (pitchIntegral > iMax) {
                pitchIntegral = iMax;
            }
            cmd = gk * (pitchKp * err + pitchKi * pitchIntegral);
        } else {
            cmd = pitchMax;
            pitchIntegral = pitchMin / pitchKi;
        }
        if (cmd < pitchMin) {
            cmd = pitchMin;
        } else if (cmd > pitchMax) {
            cmd = pitchMax;
        }
        final double step = pitchRate * h;
        if (cmd > pitchCmdRad + step) {
            cmd = pitchCmdRad + step;
        } else if (cmd < pitchCmdRad - step) {
            cmd = pitchCmdRad - step;
        }
        pitchCmdRad = cmd;
    }

    private void updateWindState(double wind, double h) {
        if (state == STATE_TRIPPED) {
            return;
        }
        if (state == STATE_RUNNING) {
            if (cutOutRelay.step(wind > cutOut, h)) {
                state = STATE_STOPPED_HIGH_WIND;
                restartRelay.reset();
            } else if (cutInRelay.step(wind < cutIn, h)) {
                state = STATE_STOPPED_LOW_WIND;
                restartRelay.reset();
            }
        } else if (state == STATE_STOPPED_HIGH_WIND) {
            if (restartRelay.step(wind < cutOut - restartHyst, h)) {
                state = STATE_RUNNING;
                cutOutRelay.reset();
                cutInRelay.reset();
            }
        } else if (state == STATE_STOPPED_LOW_WIND) {
            if (restartRelay.step(wind > cutIn + 0.25 * restartHyst, h)) {
                state = STATE_RUNNING;
                cutOutRelay.reset();
                cutInRelay.reset();
            }
        }
    }

    private void protection(SensorView in, double u, double vdc, double h) {
        int cause = 0;
        if (uvRelay.step(u < uvPu, h) | uvFastRelay.step(u < uvFastPu, h)) {
            cause |= CAUSE_UNDERVOLTAGE;
        }
        if (ovRelay.step(u > ovPu, h) | ovFastRelay.step(u > ovFastPu, h)) {
            cause |= CAUSE_OVERVOLTAGE;
        }
        final double ig = Math.max(Math.abs(in.gridCurrentAA), Math.max(Math.abs(in.gridCurrentBA), Math.abs(in.gridCurrentCA)));
        if (gscOcRelay.step(ig > gscOcA, h)) {
            cause |= CAUSE_GSC_OVERCURRENT;
        }
        final double is = Math.max(Math.abs(in.statorCurrentAA), Math.max(Math.abs(in.statorCurrentBA), Math.abs(in.statorCurrentCA)));
        if (mscOcRelay.step(is > mscOcA, h)) {
            cause |= CAUSE_MSC_OVERCURRENT;
        }
        if (dcOvRelay.step(in.dcLinkVoltageV > dcOvV, h)) {
            cause |= CAUSE_DC_OVERVOLTAGE;
        }
        if ((in.statusFlags & SensorView.TRIP_MASK) != 0) {
            cause |= CAUSE_PLANT_TRIP;
        }
        if (cause != 0 && state != STATE_TRIPPED) {
            state = STATE_TRIPPED;
            tripCause = cause;
        }
    }

    private static void writeDuties(double alpha, double beta, double vdc, BoardCommand out, boolean grid) {
        final double a = alpha;
        final double b = Transforms.phaseB(alpha, beta);
        final double c = Transforms.phaseC(alpha, beta);
        // min-max zero-sequence injection: the same reach as space-vector PWM (Vdc/sqrt3)
        final double max = Math.max(a, Math.max(b, c));
        final double min = Math.min(a, Math.min(b, c));
        final double v0 = -0.5 * (max + min);
        final double inv = vdc > 1.0 ? 1.0 / vdc : 1.0;
        final double da = clamp01(0.5 + (a + v0) * inv);
        final double db = clamp01(0.5 + (b + v0) * inv);
        final double dc = clamp01(0.5 + (c + v0) * inv);
        if (grid) {
            out.gscDutyA = da;
            out.gscDutyB = db;
            out.gscDutyC = dc;
        } else {
            out.mscDutyA = da;
            out.mscDutyB = db;
            out.mscDutyC = dc;
        }
    }

    private static double clamp01(double x) {
        return x < 0.0 ? 0.0 : (x > 1.0 ? 1.0 : x);
    }

    // ------------------------------------------------------------------ bring-up and test hooks

    /** Forces the grid-side q current reference (pu; NaN returns to the reactive loop). For step-response tests and bring-up. */
    public void overrideGscQCurrentPu(double iqPu) {
        overrideGscIqPu = iqPu;
    }

    /** Forces the machine-side d current reference (A; NaN returns to MTPA / zero d). For step-response tests and bring-up. */
    public void overrideMscDCurrentA(double idA) {
        overrideMscIdA = idA;
    }

    public boolean frtActive() {
        return frt.active();
    }

    public int state() {
        return state;
    }

    public int tripCause() {
        return tripCause;
    }

    public double pllAngleRad() {
        return pll.angleRad();
    }

    public double pllFrequencyHz() {
        return pll.frequencyHz();
    }

    public boolean pllLocked() {
        return pll.locked();
    }

    /** Limited grid-side d reference, pu. */
    public double gridDCurrentRefPu() {
        return idRefPu;
    }

    /** Limited grid-side q reference, pu (capacitive reactive current is its negative). */
    public double gridQCurrentRefPu() {
        return iqRefPu;
    }

    public double gridDCurrentPu() {
        return idPu;
    }

    public double gridQCurrentPu() {
        return iqPu;
    }

    /** Negative-sequence current reference, d in the frame at -theta, pu. */
    public double gridNegDCurrentRefPu() {
        return negDRefPu;
    }

    /** Negative-sequence current reference, q in the frame at -theta, pu. */
    public double gridNegQCurrentRefPu() {
        return negQRefPu;
    }

    /** Negative-sequence current (DDSRF), d in the frame at -theta, pu. */
    public double gridNegDCurrentPu() {
        return negDPu;
    }

    /** Negative-sequence current (DDSRF), q in the frame at -theta, pu. */
    public double gridNegQCurrentPu() {
        return negQPu;
    }

    /** Negative-sequence terminal voltage magnitude (DDSRF), pu. */
    public double negativeSequenceVoltagePu() {
        return negVoltagePu;
    }

    /** Filtered terminal voltage magnitude (positive sequence), pu. */
    public double terminalVoltagePu() {
        return voltagePu;
    }

    /** Pre-fault (slow mean) voltage, pu. */
    public double preFaultVoltagePu() {
        return preFaultVoltage.value();
    }

    public double statorDCurrentA() {
        return mscIdA;
    }

    public double statorQCurrentA() {
        return mscIqA;
    }

    public double statorDCurrentRefA() {
        return mscIdRefA;
    }

    public double statorQCurrentRefA() {
        return mscIqRefA;
    }

    public double torqueReferenceNm() {
        return mscTorqueRefNm;
    }

    public double pitchCommandRad() {
        return pitchCmdRad;
    }

    public double statorCurrentBaseA() {
        return statorBase;
    }
}
