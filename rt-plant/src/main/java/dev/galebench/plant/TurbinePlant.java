package dev.galebench.plant;

/**
 * The full-converter wind turbine as a fixed-step plant: wind, rotor aerodynamics (analytic
 * Cp surface), pitch servo, one- or two-mass drivetrain, PMSG in the rotor dq frame,
 * switching-cycle-averaged machine- and grid-side converters, DC link with braking chopper,
 * grid choke + converter transformer + plant transformer + Thevenin grid with a programmable
 * source, measurement front end, hardware protection. Model equations, conventions and
 * validation are in {@code rt-plant/README.md}.
 *
 * <h2>Solver</h2>
 * Classic fourth-order Runge-Kutta on 11 states with the board command held over the step
 * (zero-order hold, as the PWM holds its references). With the default turbine the largest
 * eigenvalue of the open-loop Jacobian is about -9 +- 330j 1/s (grid side and DC link), so
 * |lambda| h is below 0.02 at 50 us, far inside the RK4 stability region at 50, 20 and 10 us. The only stiff parts, the anti-alias filters (time constants of tens of
 * microseconds), are not integrated by RK4: they use the exact discretisation for an input
 * that is linear over the step, which is unconditionally stable. Costs per step: four
 * derivative evaluations (each: one {@code exp} for Cp, two sin/cos pairs), one output
 * evaluation, 13 filter updates.
 *
 * <h2>Conventions</h2>
 * Generator convention for the stator (current out of the machine); grid current from the
 * converter towards the grid; amplitude-invariant Park with q leading d; grid dq in the frame
 * of the true source angle (d on phase a of the source); reactive power positive =
 * capacitive (over-excited) injection, which is {@code i_q < 0} in that frame. The grid
 * network is lumped into one series R-L per phase referred to LV; the terminal (LV side of
 * the converter transformer) and the point of connection (HV side of the plant transformer)
 * voltages are computed algebraically from the current and its derivative. The three-wire
 * system is solved in alpha-beta, so zero sequence never appears.
 *
 * <h2>Blocked gates</h2>
 * A blocked converter (not enabled, or any latched trip) is modelled as a zero current
 * source: its phase currents are set to zero at the start of the step and stay there; the
 * magnetic energy of the inductances at that instant is dropped. The diode bridge's
 * uncontrolled rectification is not modelled; the turbine-file validation keeps the DC
 * voltage above the grid's line-to-line peak and the generator EMF at the overspeed trip
 * below the DC trip, where the diodes would stay blocked anyway.
 *
 * <h2>Protection (hardware, latched until a trip-reset edge)</h2>
 * Peak phase current above {@code converter.*_current_trip_a}, DC voltage above
 * {@code dc_link.overvoltage_trip_v}, rotor or generator speed above
 * {@code rotor.overspeed_trip_rad_s}, or {@link #forceTrip}: both converters block from the
 * next step on; overspeed also feathers the blades (pitch reference = maximum). The chopper
 * keeps obeying its duty.
 *
 * <h2>Real-time use</h2>
 * {@link #step}, {@link #sense}, {@link #sample} and the setters allocate nothing and never
 * throw; non-finite inputs are ignored (setters) or replaced (a NaN duty counts as 0.5, a NaN
 * pitch reference holds the pitch). Bit-for-bit deterministic for equal inputs on one JVM
 * build (plain double arithmetic, {@code Math} intrinsics).
 */
public final class TurbinePlant implements PlantModel {
    // ---- state vector indices ----
    static final int W_ROTOR = 0;      // rotor speed, LSS, rad/s
    static final int W_GEN = 1;        // generator speed referred to LSS, rad/s
    static final int TWIST = 2;        // shaft twist, LSS, rad
    static final int GEN_ANGLE = 3;    // generator mechanical angle (own shaft), rad
    static final int PITCH = 4;        // pitch, rad
    static final int I_D = 5;          // stator d current, A (generator convention)
    static final int I_Q = 6;          // stator q current, A
    static final int V_DC = 7;         // DC-link voltage, V
    static final int I_ALPHA = 8;      // grid current alpha, A
    static final int I_BETA = 9;       // grid current beta, A
    static final int GRID_ANGLE = 10;  // grid source angle without the phase offset, rad
    static final int STATE_COUNT = 11;

    // ---- signal indices (SIGNALS.md order) ----
    static final int S_WIND = 0, S_W_ROTOR = 1, S_W_GEN = 2, S_PITCH_DEG = 3, S_TSR = 4, S_CP = 5, S_P_AERO = 6,
            S_T_AERO = 7, S_T_GEN = 8, S_T_SHAFT = 9, S_VDC = 10, S_P_CHOP = 11, S_IS_A = 12, S_IS_B = 13, S_IS_C = 14,
            S_IS_D = 15, S_IS_Q = 16, S_VS_D = 17, S_VS_Q = 18, S_P_STATOR = 19, S_VT_A = 20, S_VT_B = 21, S_VT_C = 22,
            S_IG_A = 23, S_IG_B = 24, S_IG_C = 25, S_VT_D = 26, S_VT_Q = 27, S_IG_D = 28, S_IG_Q = 29, S_VT_PU = 30,
            S_VT_NEG_PU = 31, S_I_ACT_PU = 32, S_I_REACT_PU = 33, S_P_GRID = 34, S_Q_GRID = 35, S_P_GRID_PU = 36,
            S_Q_GRID_PU = 37, S_P_POC = 38, S_Q_POC = 39, S_V_POC_PU = 40, S_V_SOURCE_PU = 41, S_FREQ = 42,
            S_LOSSES = 43, S_TRIPS = 44, S_STATUS = 45;
    private static final String[] SIGNAL_NAMES = {
        "wind_m_s", "rotor_speed_rad_s", "generator_speed_rad_s", "pitch_deg", "tip_speed_ratio", "cp", "p_aero_w",
        "t_aero_nm", "t_gen_nm", "t_shaft_nm", "v_dc_v", "p_chopper_w", "i_stator_a_a", "i_stator_b_a", "i_stator_c_a",
        "i_stator_d_a", "i_stator_q_a", "v_stator_d_v", "v_stator_q_v", "p_stator_w", "v_term_a_v", "v_term_b_v",
        "v_term_c_v", "i_grid_a_a", "i_grid_b_a", "i_grid_c_a", "v_term_d_v", "v_term_q_v", "i_grid_d_a", "i_grid_q_a",
        "v_term_pu", "v_term_neg_pu", "i_active_pu", "i_reactive_pu", "p_grid_w", "q_grid_var", "p_grid_pu",
        "q_grid_pu", "p_poc_w", "q_poc_var", "v_poc_pu", "v_source_pu", "grid_frequency_hz", "losses_w",
        "trip_flags", "status_flags"};
    private static final String[] SIGNAL_UNITS = {
        "m/s", "rad/s", "rad/s", "deg", "1", "1", "W", "N m", "N m", "N m", "V", "W", "A", "A", "A", "A", "A", "V", "V",
        "W", "V", "V", "V", "A", "A", "A", "V", "V", "A", "A", "pu", "pu", "pu", "pu", "W", "var", "pu", "pu", "W",
        "var", "pu", "pu", "Hz", "W", "bits", "bits"};

    // ---- measurement channels ----
    private static final int M_VT_A = 0, M_VT_B = 1, M_VT_C = 2, M_IG_A = 3, M_IG_B = 4, M_IG_C = 5, M_VS_A = 6,
            M_VS_B = 7, M_VS_C = 8, M_IS_A = 9, M_IS_B = 10, M_IS_C = 11, M_VDC = 12, CHANNELS = 13;

    private static final double TWO_PI = 2.0 * Math.PI;
    private static final double SQRT3_2 = Math.sqrt(3.0) / 2.0;
    private static final double INV_SQRT3 = 1.0 / Math.sqrt(3.0);
    private static final double RAD_TO_DEG = 180.0 / Math.PI;

    private final TurbineParameters params;
    private final long stepPeriodNs;
    private final double h;

    // parameters as primitives
    private final CpSurface cps;
    private final double radiusM, aeroTorqueFactor, sweptAreaHalfRho;
    private final double pitchMin, pitchMax, pitchRateMax, pitchTau;
    private final boolean twoMass;
    private final double jRotor, jGenLss, jTotal, kShaft, dShaft, friction, gear;
    private final int polePairs;
    private final double rs, ld, lq, psi;
    private final double cDc, rChopper, vdcTrip, mscTrip, gscTrip, overspeed;
    private final double rChoke, lChoke, rCt, rPt;
    private final double lvPeakV, ratedPowerW, ratedCurrentPeakA, nominalFrequencyHz;
    private final double lxTrafos; // transformer inductances (fixed part of the lumped L)
    private double rGrid, lGrid, rTotal, lTotal, invLTotal;

    // state and RK4 scratch
    final double[] x = new double[STATE_COUNT];
    private final double[] k1 = new double[STATE_COUNT], k2 = new double[STATE_COUNT],
            k3 = new double[STATE_COUNT], k4 = new double[STATE_COUNT], xs = new double[STATE_COUNT];
    private long stepCount;

    // inputs (programmable)
    private double windMPerS;
    private double sourceA = 1.0, sourceB = 1.0, sourceC = 1.0;
    private double phaseOffsetRad;
    private double frequencyHz;
    private double scr, xOverR;
    private double voltageDeviationRefPu;

    // latched command
    private final BoardCommand initialCommand = new BoardCommand();
    private double mscMa, mscMb, gscMa, gscMb, chopperDuty, pitchRefRad;
    private boolean mscOn, gscOn, breakerClosed, resetWasHigh;
    private int tripFlags;

    // outputs
    private final double[] sig = new double[SIGNAL_NAMES.length];
    private final double[] raw = new double[CHANNELS], rawPrev = new double[CHANNELS], filt = new double[CHANNELS];
    private final double[] filterA = new double[CHANNELS], filterB = new double[CHANNELS];
    private double cosE, sinE, cosG, sinG;
    private double vtAlpha, vtBeta, vpAlpha, vpBeta;

    // one-period windows for sequence magnitudes (term +, term -, poc +)
    private final int windowLength;
    private final double[] wTd, wTq, wNd, wNq, wPd, wPq;
    private double sTd, sTq, sNd, sNq, sPd, sPq;
    private int windowIndex;

    public TurbinePlant(TurbineParameters p, long stepPeriodNs) {
        if (stepPeriodNs < 1_000 || stepPeriodNs > 1_000_000) {
            throw new IllegalArgumentException("step period: must be within 1 us .. 1 ms, got " + stepPeriodNs + " ns");
        }
        this.params = p;
        this.stepPeriodNs = stepPeriodNs;
        this.h = stepPeriodNs * 1e-9;
        this.cps = CpSurface.of(p);
        this.radiusM = p.rotorRadiusM;
        this.aeroTorqueFactor = 0.5 * p.airDensityKgPerM3 * Math.PI * radiusM * radiusM * radiusM;
        this.sweptAreaHalfRho = 0.5 * p.airDensityKgPerM3 * Math.PI * radiusM * radiusM;
        this.pitchMin = p.pitchMinRad;
        this.pitchMax = p.pitchMaxRad;
        this.pitchRateMax = p.pitchRateMaxRadPerS;
        this.pitchTau = p.pitchServoTimeConstantS;
        this.twoMass = p.twoMass;
        this.gear = p.gearRatio;
        this.jRotor = p.rotorInertiaKgM2;
        this.jGenLss = p.generatorInertiaKgM2 * gear * gear;
        this.jTotal = jRotor + jGenLss;
        this.kShaft = p.shaftStiffnessNmPerRad;
        this.dShaft = p.shaftDampingNmsPerRad;
        this.friction = p.frictionNmsPerRad;
        this.polePairs = p.polePairs;
        this.rs = p.statorResistanceOhm;
        this.ld = p.dAxisInductanceH;
        this.lq = p.qAxisInductanceH;
        this.psi = p.magnetFluxWb;
        this.cDc = p.dcCapacitanceF;
        this.rChopper = p.chopperResistanceOhm;
        this.vdcTrip = p.dcOvervoltageTripV;
        this.mscTrip = p.mscCurrentTripA;
        this.gscTrip = p.gscCurrentTripA;
        this.overspeed = p.overspeedTripRadPerS;
        GridNetwork net = new GridNetwork(p);
        this.rChoke = net.chokeResistanceOhm;
        this.lChoke = net.chokeInductanceH;
        this.rCt = net.converterTransformerResistanceOhm;
        this.rPt = net.plantTransformerResistanceOhm;
        this.lxTrafos = net.converterTransformerInductanceH + net.plantTransformerInductanceH;
        PerUnitBase base = PerUnitBase.gridSide(p);
        this.lvPeakV = base.voltagePeakV;
        this.ratedPowerW = p.ratedPowerW;
        this.ratedCurrentPeakA = base.currentPeakA;
        this.nominalFrequencyHz = p.gridFrequencyHz;
        this.frequencyHz = p.gridFrequencyHz;
        applyGridStrength(p.shortCircuitRatio, p.gridXOverR);
        setFilter(M_VT_A, p.voltageFilterTimeConstantS);
        setFilter(M_VT_B, p.voltageFilterTimeConstantS);
        setFilter(M_VT_C, p.voltageFilterTimeConstantS);
        setFilter(M_VS_A, p.voltageFilterTimeConstantS);
        setFilter(M_VS_B, p.voltageFilterTimeConstantS);
        setFilter(M_VS_C, p.voltageFilterTimeConstantS);
        setFilter(M_VDC, p.voltageFilterTimeConstantS);
        setFilter(M_IG_A, p.currentFilterTimeConstantS);
        setFilter(M_IG_B, p.currentFilterTimeConstantS);
        setFilter(M_IG_C, p.currentFilterTimeConstantS);
        setFilter(M_IS_A, p.currentFilterTimeConstantS);
        setFilter(M_IS_B, p.currentFilterTimeConstantS);
        setFilter(M_IS_C, p.currentFilterTimeConstantS);
        this.windowLength = Math.max(1, (int) Math.round(1.0 / (nominalFrequencyHz * h)));
        wTd = new double[windowLength]; wTq = new double[windowLength];
        wNd = new double[windowLength]; wNq = new double[windowLength];
        wPd = new double[windowLength]; wPq = new double[windowLength];
        initialise(SteadyState.solve(p, 0.0, 1.0, 0.0));
    }

    /** The parameters this plant was built from. */
    public TurbineParameters parameters() {
        return params;
    }

    /**
     * Puts the plant into the settled state {@code op}: states, inputs (wind, balanced grid
     * source at the point's voltage, nominal frequency, zero phase offset, the file's grid
     * strength), converters enabled, breaker closed, no trips, filters and sequence windows
     * settled, plant time 0, both angles 0. The held command until the first {@link #step} is
     * the point's own (see {@link OperatingPoint#fillCommand}) for the angles half a step ago.
     */
    public void initialise(OperatingPoint op) {
        x[W_ROTOR] = op.rotorSpeedRadPerS;
        x[W_GEN] = op.rotorSpeedRadPerS;
        x[TWIST] = twoMass ? op.shaftTwistRad : 0.0;
        x[GEN_ANGLE] = 0.0;
        x[PITCH] = op.pitchRad;
        x[I_D] = op.statorCurrentDA;
        x[I_Q] = op.statorCurrentQA;
        x[V_DC] = op.dcLinkVoltageV;
        x[I_ALPHA] = op.gridCurrentDA;
        x[I_BETA] = op.gridCurrentQA;
        x[GRID_ANGLE] = 0.0;
        stepCount = 0;
        windMPerS = op.windMPerS;
        sourceA = sourceB = sourceC = op.gridVoltagePu;
        phaseOffsetRad = 0.0;
        frequencyHz = nominalFrequencyHz;
        applyGridStrength(params.shortCircuitRatio, params.gridXOverR);
        tripFlags = 0;
        resetWasHigh = false;
        // The held command is the one a settled board would have applied during the previous
        // step: duties for the angles at its middle (-h/2). Outputs at step ends then look the
        // same before and after the first step (the converter voltage is a zero-order hold).
        final BoardCommand c = initialCommand;
        op.fillCommand(c, -0.5 * h * op.generatorElectricalSpeedRadPerS, -0.5 * h * TWO_PI * nominalFrequencyHz,
                op.dcLinkVoltageV);
        latch(c);
        computeOutputs();
        for (int i = 0; i < CHANNELS; i++) {
            rawPrev[i] = raw[i];
            filt[i] = raw[i];
        }
        fillWindows();
        finishSignals();
    }

    @Override
    public long stepPeriodNs() {
        return stepPeriodNs;
    }

    @Override
    public long plantTimeNs() {
        return stepCount * stepPeriodNs;
    }

    /** Number of steps taken since {@link #initialise}. */
    public long stepCount() {
        return stepCount;
    }

    /** True grid-source angle now (including the phase offset), rad, wrapped to [0, 2 pi) before the offset. */
    public double gridAngleRad() {
        return x[GRID_ANGLE] + phaseOffsetRad;
    }

    /** Grid source angular frequency now, rad/s. */
    public double gridAngularFrequencyRadPerS() {
        return TWO_PI * frequencyHz;
    }

    /** Generator electrical angle now (pole pairs times the mechanical angle), rad. */
    public double generatorElectricalAngleRad() {
        return polePairs * x[GEN_ANGLE];
    }

    /** Generator electrical angular speed now, rad/s. */
    public double generatorElectricalSpeedRadPerS() {
        return polePairs * gear * x[W_GEN];
    }

    /** DC-link voltage now (unfiltered), V. */
    public double dcLinkVoltageV() {
        return x[V_DC];
    }

    @Override
    public void step(BoardCommand command) {
        latch(command);
        final double[] s = x;
        if (!mscOn) {
            s[I_D] = 0.0;
            s[I_Q] = 0.0;
        }
        if (!(gscOn && breakerClosed)) {
            s[I_ALPHA] = 0.0;
            s[I_BETA] = 0.0;
        }
        final double hh = h;
        final double half = 0.5 * hh;
        derivatives(s, k1);
        for (int i = 0; i < STATE_COUNT; i++) {
            xs[i] = s[i] + half * k1[i];
        }
        derivatives(xs, k2);
        for (int i = 0; i < STATE_COUNT; i++) {
            xs[i] = s[i] + half * k2[i];
        }
        derivatives(xs, k3);
        for (int i = 0; i < STATE_COUNT; i++) {
            xs[i] = s[i] + hh * k3[i];
        }
        derivatives(xs, k4);
        final double sixth = hh / 6.0;
        for (int i = 0; i < STATE_COUNT; i++) {
            s[i] += sixth * (k1[i] + 2.0 * (k2[i] + k3[i]) + k4[i]);
        }
        // limits and angle wrapping
        if (s[PITCH] > pitchMax) {
            s[PITCH] = pitchMax;
        } else if (s[PITCH] < pitchMin) {
            s[PITCH] = pitchMin;
        }
        if (s[V_DC] < 0.0) {
            s[V_DC] = 0.0;
        }
        double a = s[GEN_ANGLE];
        if (a >= TWO_PI || a < 0.0) {
            a -= TWO_PI * Math.floor(a / TWO_PI);
            s[GEN_ANGLE] = a;
        }
        double g = s[GRID_ANGLE];
        if (g >= TWO_PI || g < 0.0) {
            g -= TWO_PI * Math.floor(g / TWO_PI);
            s[GRID_ANGLE] = g;
        }
        stepCount++;
        computeOutputs();
        for (int i = 0; i < CHANNELS; i++) {
            final double u0 = rawPrev[i];
            final double u1 = raw[i];
            final double aa = filterA[i];
            filt[i] = aa * filt[i] + (1.0 - aa) * u0 + (u1 - u0) * filterB[i];
            rawPrev[i] = u1;
        }
        updateWindows();
        checkTrips();
        finishSignals();
    }

    /** Latches the command for the next integration step (clamps, NaN guards, trip overrides). */
    void latch(BoardCommand cmd) {
        final int flags = cmd.commandFlags;
        final boolean reset = (flags & BoardCommand.CMD_TRIP_RESET) != 0;
        if (reset && !resetWasHigh) {
            tripFlags = 0;
        }
        resetWasHigh = reset;
        final boolean healthy = tripFlags == 0;
        mscOn = healthy && (flags & BoardCommand.CMD_MSC_ENABLE) != 0;
        gscOn = healthy && (flags & BoardCommand.CMD_GSC_ENABLE) != 0;
        breakerClosed = (flags & BoardCommand.CMD_BREAKER_CLOSE) != 0;
        final double da = duty(cmd.mscDutyA), db = duty(cmd.mscDutyB), dc = duty(cmd.mscDutyC);
        mscMa = (2.0 / 3.0) * (da - 0.5 * (db + dc));
        mscMb = (db - dc) * INV_SQRT3;
        final double ga = duty(cmd.gscDutyA), gb = duty(cmd.gscDutyB), gc = duty(cmd.gscDutyC);
        gscMa = (2.0 / 3.0) * (ga - 0.5 * (gb + gc));
        gscMb = (gb - gc) * INV_SQRT3;
        final double ch = cmd.chopperDuty;
        chopperDuty = ch > 0.0 ? (ch < 1.0 ? ch : 1.0) : 0.0;
        double ref = cmd.pitchRefRad;
        if ((tripFlags & SensorView.TRIP_OVERSPEED) != 0) {
            ref = pitchMax;
        } else if (ref != ref) {
            ref = x[PITCH];
        }
        pitchRefRad = ref > pitchMax ? pitchMax : (ref < pitchMin ? pitchMin : ref);
    }

    private static double duty(double d) {
        return d > 0.0 ? (d < 1.0 ? d : 1.0) : (d == d ? 0.0 : 0.5);
    }

    /**
     * The state derivative with the latched inputs held: {@code dx = f(x)}. Package-private so
     * a test can integrate the same right-hand side with an independent integrator.
     */
    void derivatives(double[] s, double[] dx) {
        final double wr = s[W_ROTOR];
        final double wg = s[W_GEN];
        final double beta = s[PITCH];
        final double vdc = s[V_DC];

        // aerodynamics
        final double tAero = aeroTorque(cps, aeroTorqueFactor, radiusM, wr, beta, windMPerS);

        // generator
        final double we = polePairs * gear * wg;
        double te = 0.0;
        double idcMsc = 0.0;
        if (mscOn) {
            final double id = s[I_D];
            final double iq = s[I_Q];
            final double th = polePairs * s[GEN_ANGLE];
            final double c = Math.cos(th);
            final double sn = Math.sin(th);
            final double vd = vdc * (mscMa * c + mscMb * sn);
            final double vq = vdc * (-mscMa * sn + mscMb * c);
            dx[I_D] = (-vd - rs * id + we * lq * iq) / ld;
            dx[I_Q] = (-vq - rs * iq - we * ld * id + we * psi) / lq;
            te = 1.5 * polePairs * (psi * iq - (ld - lq) * id * iq);
            idcMsc = 1.5 * (mscMa * (id * c - iq * sn) + mscMb * (id * sn + iq * c));
        } else {
            dx[I_D] = 0.0;
            dx[I_Q] = 0.0;
        }

        // drivetrain (low-speed side)
        final double teLss = gear * te;
        if (twoMass) {
            final double tsh = kShaft * s[TWIST] + dShaft * (wr - wg);
            dx[W_ROTOR] = (tAero - friction * wr - tsh) / jRotor;
            dx[W_GEN] = (tsh - teLss) / jGenLss;
            dx[TWIST] = wr - wg;
        } else {
            final double acc = (tAero - friction * wr - teLss) / jTotal;
            dx[W_ROTOR] = acc;
            dx[W_GEN] = acc;
            dx[TWIST] = 0.0;
        }
        dx[GEN_ANGLE] = gear * wg;

        // pitch servo: first order, rate and position limited
        double rate = (pitchRefRad - beta) / pitchTau;
        if (rate > pitchRateMax) {
            rate = pitchRateMax;
        } else if (rate < -pitchRateMax) {
            rate = -pitchRateMax;
        }
        if ((beta >= pitchMax && rate > 0.0) || (beta <= pitchMin && rate < 0.0)) {
            rate = 0.0;
        }
        dx[PITCH] = rate;

        // grid side
        double idcGsc = 0.0;
        if (gscOn && breakerClosed) {
            final double th = s[GRID_ANGLE] + phaseOffsetRad;
            final double c = Math.cos(th);
            final double sn = Math.sin(th);
            final double ea = lvPeakV * sourceA * c;
            final double eb = lvPeakV * sourceB * (-0.5 * c + SQRT3_2 * sn);
            final double ec = lvPeakV * sourceC * (-0.5 * c - SQRT3_2 * sn);
            final double eAlpha = (2.0 / 3.0) * (ea - 0.5 * (eb + ec));
            final double eBeta = (eb - ec) * INV_SQRT3;
            final double ia = s[I_ALPHA];
            final double ib = s[I_BETA];
            dx[I_ALPHA] = (vdc * gscMa - eAlpha - rTotal * ia) * invLTotal;
            dx[I_BETA] = (vdc * gscMb - eBeta - rTotal * ib) * invLTotal;
            idcGsc = 1.5 * (gscMa * ia + gscMb * ib);
        } else {
            dx[I_ALPHA] = 0.0;
            dx[I_BETA] = 0.0;
        }
        dx[V_DC] = (idcMsc - idcGsc - chopperDuty * vdc / rChopper) / cDc;
        dx[GRID_ANGLE] = TWO_PI * frequencyHz;
    }

    /**
     * Aerodynamic torque on the rotor, N m: {@code 1/2 rho pi R^3 v^2 Cp(lambda, beta) / lambda}
     * for lambda >= 1. Below lambda = 1 the fit is meaningless; the guard keeps the torque
     * continuous: a positive Cp(1, beta) gives the constant starting torque of lambda = 1, a
     * negative one (feathered blades: aerodynamic braking) a drag proportional to lambda, zero at
     * rest and restoring for reverse rotation. Zero below 0.1 m/s of wind.
     *
     * @param factor 1/2 rho pi R^3
     */
    static double aeroTorque(CpSurface cps, double factor, double radiusM, double rotorSpeedRadPerS, double pitchRad,
                             double windMPerS) {
        if (!(windMPerS > 0.1)) {
            return 0.0;
        }
        final double lambda = rotorSpeedRadPerS * radiusM / windMPerS;
        final double q = factor * windMPerS * windMPerS;
        if (lambda >= 1.0) {
            return q * cps.cp(lambda, pitchRad * RAD_TO_DEG) / lambda;
        }
        final double c = cps.cp(1.0, pitchRad * RAD_TO_DEG);
        return c >= 0.0 ? q * c : q * c * (lambda > -1.0 ? lambda : -1.0);
    }

    /** Algebraic outputs at the present state: signal array and raw measurement channels. */
    private void computeOutputs() {
        final double[] s = x;
        final double[] o = sig;
        final double wr = s[W_ROTOR];
        final double wg = s[W_GEN];
        final double beta = s[PITCH];
        final double vdc = s[V_DC];
        final double v = windMPerS;

        final double tAero = aeroTorque(cps, aeroTorqueFactor, radiusM, wr, beta, v);
        double lambda = 0.0;
        double cpNow = 0.0;
        if (v > 0.1) {
            lambda = wr * radiusM / v;
            cpNow = tAero * wr / (sweptAreaHalfRho * v * v * v);
        }
        final double pAero = tAero * wr;

        // generator
        final double we = polePairs * gear * wg;
        final double id = s[I_D];
        final double iq = s[I_Q];
        final double th = polePairs * s[GEN_ANGLE];
        final double ce = Math.cos(th);
        final double se = Math.sin(th);
        cosE = ce;
        sinE = se;
        double vd;
        double vq;
        if (mscOn) {
            vd = vdc * (mscMa * ce + mscMb * se);
            vq = vdc * (-mscMa * se + mscMb * ce);
        } else {
            vd = -rs * id + we * lq * iq;
            vq = -rs * iq - we * ld * id + we * psi;
        }
        final double te = 1.5 * polePairs * (psi * iq - (ld - lq) * id * iq);
        final double tShaft = twoMass ? kShaft * s[TWIST] + dShaft * (wr - wg) : gear * te;
        final double pStator = 1.5 * (vd * id + vq * iq);
        // inverse Park to phases: b at theta - 2pi/3, c at theta + 2pi/3
        final double cb = -0.5 * ce + SQRT3_2 * se, sb = -0.5 * se - SQRT3_2 * ce;
        final double cc = -0.5 * ce - SQRT3_2 * se, sc = -0.5 * se + SQRT3_2 * ce;
        final double isA = id * ce - iq * se, isB = id * cb - iq * sb, isC = id * cc - iq * sc;
        raw[M_IS_A] = isA; raw[M_IS_B] = isB; raw[M_IS_C] = isC;
        raw[M_VS_A] = vd * ce - vq * se; raw[M_VS_B] = vd * cb - vq * sb; raw[M_VS_C] = vd * cc - vq * sc;

        // grid side
        final double tg = s[GRID_ANGLE] + phaseOffsetRad;
        final double cg = Math.cos(tg);
        final double sg = Math.sin(tg);
        cosG = cg;
        sinG = sg;
        final double ea = lvPeakV * sourceA * cg;
        final double eb = lvPeakV * sourceB * (-0.5 * cg + SQRT3_2 * sg);
        final double ec = lvPeakV * sourceC * (-0.5 * cg - SQRT3_2 * sg);
        final double eAlpha = (2.0 / 3.0) * (ea - 0.5 * (eb + ec));
        final double eBeta = (eb - ec) * INV_SQRT3;
        final double ia = s[I_ALPHA];
        final double ib = s[I_BETA];
        final double vcAlpha = gscOn ? vdc * gscMa : 0.0;
        final double vcBeta = gscOn ? vdc * gscMb : 0.0;
        double vta, vtb, vpa, vpb;
        if (gscOn && breakerClosed) {
            final double da = (vcAlpha - eAlpha - rTotal * ia) * invLTotal;
            final double db = (vcBeta - eBeta - rTotal * ib) * invLTotal;
            vta = vcAlpha - rChoke * ia - lChoke * da;
            vtb = vcBeta - rChoke * ib - lChoke * db;
            vpa = eAlpha + rGrid * ia + lGrid * da;
            vpb = eBeta + rGrid * ib + lGrid * db;
        } else if (breakerClosed) {
            vta = eAlpha; vtb = eBeta; vpa = eAlpha; vpb = eBeta;
        } else {
            vta = vcAlpha; vtb = vcBeta; vpa = eAlpha; vpb = eBeta;
        }
        vtAlpha = vta; vtBeta = vtb; vpAlpha = vpa; vpBeta = vpb;
        raw[M_VT_A] = vta;
        raw[M_VT_B] = -0.5 * vta + SQRT3_2 * vtb;
        raw[M_VT_C] = -0.5 * vta - SQRT3_2 * vtb;
        raw[M_IG_A] = ia;
        raw[M_IG_B] = -0.5 * ia + SQRT3_2 * ib;
        raw[M_IG_C] = -0.5 * ia - SQRT3_2 * ib;
        raw[M_VDC] = vdc;
        final double vtd = vta * cg + vtb * sg, vtq = -vta * sg + vtb * cg;
        final double igd = ia * cg + ib * sg, igq = -ia * sg + ib * cg;
        final double pGrid = 1.5 * (vta * ia + vtb * ib);
        final double qGrid = 1.5 * (vtb * ia - vta * ib);
        final double pPoc = 1.5 * (vpa * ia + vpb * ib);
        final double qPoc = 1.5 * (vpb * ia - vpa * ib);
        final double vtMag = Math.sqrt(vta * vta + vtb * vtb);
        double iAct;
        double iReact;
        if (vtMag > 0.05 * lvPeakV) {
            iAct = (vta * ia + vtb * ib) / vtMag;
            iReact = (vtb * ia - vta * ib) / vtMag;
        } else {
            iAct = igd;
            iReact = -igq;
        }
        final double pChop = chopperDuty * vdc * vdc / rChopper;
        final double losses = 1.5 * rs * (id * id + iq * iq) + 1.5 * (rChoke + rCt + rPt) * (ia * ia + ib * ib)
                + pChop + friction * wr * wr;

        o[S_WIND] = v;
        o[S_W_ROTOR] = wr;
        o[S_W_GEN] = gear * wg;
        o[S_PITCH_DEG] = beta * RAD_TO_DEG;
        o[S_TSR] = lambda;
        o[S_CP] = cpNow;
        o[S_P_AERO] = pAero;
        o[S_T_AERO] = tAero;
        o[S_T_GEN] = te;
        o[S_T_SHAFT] = tShaft;
        o[S_VDC] = vdc;
        o[S_P_CHOP] = pChop;
        o[S_IS_A] = isA; o[S_IS_B] = isB; o[S_IS_C] = isC;
        o[S_IS_D] = id; o[S_IS_Q] = iq;
        o[S_VS_D] = vd; o[S_VS_Q] = vq;
        o[S_P_STATOR] = pStator;
        o[S_VT_A] = raw[M_VT_A]; o[S_VT_B] = raw[M_VT_B]; o[S_VT_C] = raw[M_VT_C];
        o[S_IG_A] = raw[M_IG_A]; o[S_IG_B] = raw[M_IG_B]; o[S_IG_C] = raw[M_IG_C];
        o[S_VT_D] = vtd; o[S_VT_Q] = vtq; o[S_IG_D] = igd; o[S_IG_Q] = igq;
        o[S_I_ACT_PU] = iAct / ratedCurrentPeakA;
        o[S_I_REACT_PU] = iReact / ratedCurrentPeakA;
        o[S_P_GRID] = pGrid; o[S_Q_GRID] = qGrid;
        o[S_P_GRID_PU] = pGrid / ratedPowerW; o[S_Q_GRID_PU] = qGrid / ratedPowerW;
        o[S_P_POC] = pPoc; o[S_Q_POC] = qPoc;
        o[S_V_SOURCE_PU] = (sourceA + sourceB + sourceC) / 3.0;
        o[S_FREQ] = frequencyHz;
        o[S_LOSSES] = losses;
    }

    /**
     * Fills the sequence windows with the history of a settled state: the last N samples at
     * grid angles theta - j omega h (j = 0..N-1). The positive-sequence frames see constants;
     * the negative-sequence frame sees the vector rotating at -2 omega, whose one-period sum
     * is zero.
     */
    private void fillWindows() {
        final double vta = vtAlpha, vtb = vtBeta, cg = cosG, sg = sinG;
        final double td = vta * cg + vtb * sg, tq = -vta * sg + vtb * cg;
        final double pd = vpAlpha * cg + vpBeta * sg, pq = -vpAlpha * sg + vpBeta * cg;
        final double theta = x[GRID_ANGLE] + phaseOffsetRad;
        final double dTheta = TWO_PI * frequencyHz * h;
        final int n = windowLength;
        sTd = 0.0; sTq = 0.0; sNd = 0.0; sNq = 0.0; sPd = 0.0; sPq = 0.0;
        for (int i = 0; i < n; i++) {
            final int j = n - 1 - i;
            final double a = 2.0 * (theta - j * dTheta);
            final double c = Math.cos(a);
            final double sn = Math.sin(a);
            wTd[i] = td; wTq[i] = tq; wPd[i] = pd; wPq[i] = pq;
            wNd[i] = td * c - tq * sn;
            wNq[i] = td * sn + tq * c;
            sTd += td; sTq += tq; sPd += pd; sPq += pq; sNd += wNd[i]; sNq += wNq[i];
        }
        windowIndex = 0;
    }

    private void updateWindows() {
        final double vta = vtAlpha, vtb = vtBeta, cg = cosG, sg = sinG;
        final double td = vta * cg + vtb * sg, tq = -vta * sg + vtb * cg;
        final double nd = vta * cg - vtb * sg, nq = vta * sg + vtb * cg;
        final double pd = vpAlpha * cg + vpBeta * sg, pq = -vpAlpha * sg + vpBeta * cg;
        final int i = windowIndex;
        sTd += td - wTd[i]; wTd[i] = td;
        sTq += tq - wTq[i]; wTq[i] = tq;
        sNd += nd - wNd[i]; wNd[i] = nd;
        sNq += nq - wNq[i]; wNq[i] = nq;
        sPd += pd - wPd[i]; wPd[i] = pd;
        sPq += pq - wPq[i]; wPq[i] = pq;
        windowIndex = i + 1 == windowLength ? 0 : i + 1;
    }

    private void checkTrips() {
        int t = 0;
        final double[] r = raw;
        if (Math.abs(r[M_IS_A]) > mscTrip || Math.abs(r[M_IS_B]) > mscTrip || Math.abs(r[M_IS_C]) > mscTrip) {
            t |= SensorView.TRIP_MSC_OVERCURRENT;
        }
        if (Math.abs(r[M_IG_A]) > gscTrip || Math.abs(r[M_IG_B]) > gscTrip || Math.abs(r[M_IG_C]) > gscTrip) {
            t |= SensorView.TRIP_GSC_OVERCURRENT;
        }
        if (x[V_DC] > vdcTrip) {
            t |= SensorView.TRIP_DC_OVERVOLTAGE;
        }
        if (x[W_ROTOR] > overspeed || x[W_GEN] > overspeed) {
            t |= SensorView.TRIP_OVERSPEED;
        }
        tripFlags |= t;
    }

    private int statusFlags() {
        int st = 0;
        if (breakerClosed) {
            st |= SensorView.STATUS_BREAKER_CLOSED;
        }
        if (!mscOn) {
            st |= SensorView.STATUS_MSC_BLOCKED;
        }
        if (!gscOn) {
            st |= SensorView.STATUS_GSC_BLOCKED;
        }
        if (chopperDuty > 0.0) {
            st |= SensorView.STATUS_CHOPPER_ON;
        }
        return st | tripFlags;
    }

    private void finishSignals() {
        final double inv = 1.0 / (windowLength * lvPeakV);
        sig[S_VT_PU] = Math.sqrt(sTd * sTd + sTq * sTq) * inv;
        sig[S_VT_NEG_PU] = Math.sqrt(sNd * sNd + sNq * sNq) * inv;
        sig[S_V_POC_PU] = Math.sqrt(sPd * sPd + sPq * sPq) * inv;
        sig[S_TRIPS] = tripFlags;
        sig[S_STATUS] = statusFlags();
    }

    @Override
    public void sense(SensorView out) {
        final double[] f = filt;
        out.plantTimeNs = stepCount * stepPeriodNs;
        out.gridVoltageAV = f[M_VT_A]; out.gridVoltageBV = f[M_VT_B]; out.gridVoltageCV = f[M_VT_C];
        out.gridCurrentAA = f[M_IG_A]; out.gridCurrentBA = f[M_IG_B]; out.gridCurrentCA = f[M_IG_C];
        out.statorVoltageAV = f[M_VS_A]; out.statorVoltageBV = f[M_VS_B]; out.statorVoltageCV = f[M_VS_C];
        out.statorCurrentAA = f[M_IS_A]; out.statorCurrentBA = f[M_IS_B]; out.statorCurrentCA = f[M_IS_C];
        out.dcLinkVoltageV = f[M_VDC];
        out.rotorAngleRad = x[GEN_ANGLE];
        out.rotorSpeedRadPerS = gear * x[W_GEN];
        out.windSpeedMPerS = windMPerS;
        out.pitchAngleRad = x[PITCH];
        // Park of the filtered phases: grid in the source frame, stator in the rotor frame
        final double cg = cosG, sg = sinG;
        final double cgb = -0.5 * cg + SQRT3_2 * sg, sgb = -0.5 * sg - SQRT3_2 * cg;
        final double cgc = -0.5 * cg - SQRT3_2 * sg, sgc = -0.5 * sg + SQRT3_2 * cg;
        final double k = 2.0 / 3.0;
        out.gridVoltageDV = k * (f[M_VT_A] * cg + f[M_VT_B] * cgb + f[M_VT_C] * cgc);
        out.gridVoltageQV = -k * (f[M_VT_A] * sg + f[M_VT_B] * sgb + f[M_VT_C] * sgc);
        out.gridCurrentDA = k * (f[M_IG_A] * cg + f[M_IG_B] * cgb + f[M_IG_C] * cgc);
        out.gridCurrentQA = -k * (f[M_IG_A] * sg + f[M_IG_B] * sgb + f[M_IG_C] * sgc);
        final double ce = cosE, se = sinE;
        final double ceb = -0.5 * ce + SQRT3_2 * se, seb = -0.5 * se - SQRT3_2 * ce;
        final double cec = -0.5 * ce - SQRT3_2 * se, sec = -0.5 * se + SQRT3_2 * ce;
        out.statorCurrentDA = k * (f[M_IS_A] * ce + f[M_IS_B] * ceb + f[M_IS_C] * cec);
        out.statorCurrentQA = -k * (f[M_IS_A] * se + f[M_IS_B] * seb + f[M_IS_C] * sec);
        out.statorVoltageDV = k * (f[M_VS_A] * ce + f[M_VS_B] * ceb + f[M_VS_C] * cec);
        out.statorVoltageQV = -k * (f[M_VS_A] * se + f[M_VS_B] * seb + f[M_VS_C] * sec);
        out.voltageDeviationRefPu = voltageDeviationRefPu;
        out.statusFlags = statusFlags();
    }

    @Override
    public int signalCount() {
        return SIGNAL_NAMES.length;
    }

    @Override
    public String signalName(int index) {
        return SIGNAL_NAMES[index];
    }

    @Override
    public String signalUnit(int index) {
        return SIGNAL_UNITS[index];
    }

    @Override
    public void sample(double[] out) {
        System.arraycopy(sig, 0, out, 0, sig.length);
    }

    @Override
    public int tripFlags() {
        return tripFlags;
    }

    @Override
    public void setWindSpeed(double windSpeedMPerS) {
        if (windSpeedMPerS >= 0.0 && windSpeedMPerS <= 100.0) {
            windMPerS = windSpeedMPerS;
            sig[S_WIND] = windSpeedMPerS;
        }
    }

    @Override
    public void setGridVoltagePu(double phaseAPu, double phaseBPu, double phaseCPu) {
        if (phaseAPu >= 0.0 && phaseAPu <= 3.0 && phaseBPu >= 0.0 && phaseBPu <= 3.0 && phaseCPu >= 0.0 && phaseCPu <= 3.0) {
            sourceA = phaseAPu;
            sourceB = phaseBPu;
            sourceC = phaseCPu;
        }
    }

    @Override
    public void setGridPhaseOffsetRad(double phaseOffsetRad) {
        if (phaseOffsetRad == phaseOffsetRad && Math.abs(phaseOffsetRad) <= 1e6) {
            this.phaseOffsetRad = phaseOffsetRad;
        }
    }

    @Override
    public void setGridFrequencyHz(double frequencyHz) {
        if (frequencyHz >= 1.0 && frequencyHz <= 200.0) {
            this.frequencyHz = frequencyHz;
        }
    }

    @Override
    public void setGridStrength(double shortCircuitRatio, double xOverR) {
        if (shortCircuitRatio >= 0.1 && shortCircuitRatio <= 1e6 && xOverR >= 0.01 && xOverR <= 1e4) {
            applyGridStrength(shortCircuitRatio, xOverR);
        }
    }

    private void applyGridStrength(double shortCircuitRatio, double xr) {
        scr = shortCircuitRatio;
        xOverR = xr;
        final double zg = params.lvVoltageV * params.lvVoltageV / (shortCircuitRatio * params.ratedPowerW);
        rGrid = GridNetwork.resistance(zg, xr);
        lGrid = GridNetwork.reactance(zg, xr) / (TWO_PI * nominalFrequencyHz);
        rTotal = rChoke + rCt + rPt + rGrid;
        lTotal = lChoke + lxTrafos + lGrid;
        invLTotal = 1.0 / lTotal;
    }

    @Override
    public void setVoltageDeviationRefPu(double deviationPu) {
        if (deviationPu == deviationPu) {
            voltageDeviationRefPu = deviationPu;
        }
    }

    @Override
    public void forceTrip(int tripBit) {
        tripFlags |= tripBit & SensorView.TRIP_MASK;
        sig[S_TRIPS] = tripFlags;
        sig[S_STATUS] = statusFlags();
    }

    private void setFilter(int channel, double tauS) {
        if (tauS <= 0.0) {
            filterA[channel] = 0.0;
            filterB[channel] = 1.0;
        } else {
            final double a = Math.exp(-h / tauS);
            filterA[channel] = a;
            filterB[channel] = 1.0 - (tauS / h) * (1.0 - a);
        }
    }

    /** Grid short-circuit ratio in use. */
    public double shortCircuitRatio() {
        return scr;
    }

    /** Grid X/R in use. */
    public double gridXOverR() {
        return xOverR;
    }
}
