package dev.galebench.plant;

/**
 * Settled operating points, solved analytically (phasors) so a run starts with all state
 * derivatives at zero.
 *
 * <p>Method:
 * <ol>
 *   <li>Region: below cut-in or above cut-out the turbine idles (rotor at rest, pitch
 *       feathered, generator current zero; the grid-side converter still holds the DC link and
 *       any reactive power asked for). Otherwise the rotor speed is the equilibrium of the
 *       optimal-torque MPPT law {@code T_gen = k_opt w^2}, {@code k_opt = 1/2 rho pi R^5
 *       Cp_max / lambda_opt^3}, against aerodynamic torque minus friction, clamped to the
 *       minimum and the rated speed. At rated speed the pitch stays 0 while the aerodynamic
 *       power is below rated; above, the pitch is found (bisection) so the aerodynamic power
 *       equals {@code generator.rated_power_w}.</li>
 *   <li>Generator: zero d-axis current ({@code i_d = 0}), {@code i_q} from the torque; the
 *       stator voltage follows from the steady dq equations.</li>
 *   <li>Converters are lossless and the chopper is off, so the grid-side converter passes the
 *       stator power. The network (choke, transformers, Thevenin grid, all referred to LV) is
 *       solved in closed form: with the terminal power S = P + jQ (Q at the terminal from
 *       {@code reactivePowerPu}), the current magnitude squared u solves
 *       {@code |Z|^2 u^2 - (E^2 + 2 P' R + 2 Q' X) u + |S'|^2 = 0} (S' = S/1.5, Z downstream of
 *       the terminal; the smaller root is the normal high-voltage solution). The choke loss
 *       is iterated into P to round-off.</li>
 * </ol>
 */
public final class SteadyState {
    private SteadyState() {
    }

    /**
     * @param windMPerS hub wind speed, 0..60 m/s
     * @param gridVoltagePu grid source magnitude (balanced), 0.05..2 pu
     * @param reactivePowerPu reactive power at the terminal, pu of rated power, positive = capacitive, -2..2
     * @throws IllegalArgumentException on bad input or when the network cannot carry the power
     */
    public static OperatingPoint solve(TurbineParameters p, double windMPerS, double gridVoltagePu, double reactivePowerPu) {
        if (!(windMPerS >= 0.0 && windMPerS <= 60.0)) {
            throw new IllegalArgumentException("wind: must be within 0..60 m/s, got " + windMPerS);
        }
        if (!(gridVoltagePu >= 0.05 && gridVoltagePu <= 2.0)) {
            throw new IllegalArgumentException("grid voltage: must be within 0.05..2 pu, got " + gridVoltagePu);
        }
        if (!(reactivePowerPu >= -2.0 && reactivePowerPu <= 2.0)) {
            throw new IllegalArgumentException("reactive power: must be within -2..2 pu, got " + reactivePowerPu);
        }
        final CpSurface cps = CpSurface.of(p);
        final Aero aero = new Aero(p, cps);
        final OperatingPoint op = new OperatingPoint();
        op.windMPerS = windMPerS;
        op.gridVoltagePu = gridVoltagePu;
        op.reactivePowerPu = reactivePowerPu;
        op.rotorRadiusM = p.rotorRadiusM;
        op.airDensityKgPerM3 = p.airDensityKgPerM3;

        final double b = p.frictionNmsPerRad;
        final double n = p.gearRatio;
        double wr;
        double pitch;
        if (windMPerS < p.cutInWindMPerS || windMPerS > p.cutOutWindMPerS) {
            op.region = "idle";
            wr = 0.0;
            pitch = p.pitchMaxRad;
        } else {
            final double v = windMPerS;
            final double r = p.rotorRadiusM;
            final double kopt = 0.5 * p.airDensityKgPerM3 * Math.PI * Math.pow(r, 5) * cps.maxCp()
                    / Math.pow(cps.optimalTipSpeedRatio(), 3);
            pitch = Math.min(Math.max(0.0, p.pitchMinRad), p.pitchMaxRad);
            double lo = v / r;
            double hi = cps.optimalTipSpeedRatio() * v / r;
            final double pitch0 = pitch;
            java.util.function.DoubleUnaryOperator f = w -> aero.torque(w, pitch0, v) - b * w - kopt * w * w;
            if (f.applyAsDouble(lo) > 0.0 && f.applyAsDouble(hi) < 0.0) {
                for (int i = 0; i < 200; i++) {
                    double mid = 0.5 * (lo + hi);
                    if (f.applyAsDouble(mid) > 0.0) {
                        lo = mid;
                    } else {
                        hi = mid;
                    }
                }
                wr = 0.5 * (lo + hi);
            } else {
                wr = hi;
            }
            op.region = "mppt";
            if (wr > p.ratedRotorSpeedRadPerS) {
                wr = p.ratedRotorSpeedRadPerS;
                op.region = "rated-speed";
            } else if (wr < p.minRotorSpeedRadPerS) {
                wr = p.minRotorSpeedRadPerS;
                op.region = "min-speed";
            }
            if (aero.torque(wr, pitch, v) * wr > p.ratedPowerW) {
                double blo = pitch;
                double bhi = p.pitchMaxRad;
                if (aero.torque(wr, bhi, v) * wr < p.ratedPowerW) {
                    for (int i = 0; i < 200; i++) {
                        double mid = 0.5 * (blo + bhi);
                        if (aero.torque(wr, mid, v) * wr > p.ratedPowerW) {
                            blo = mid;
                        } else {
                            bhi = mid;
                        }
                    }
                    pitch = 0.5 * (blo + bhi);
                } else {
                    pitch = bhi;
                }
                op.region = "pitch";
            }
        }
        final double tAero = aero.torque(wr, pitch, windMPerS);
        op.rotorSpeedRadPerS = wr;
        op.pitchRad = pitch;
        op.aeroTorqueNm = tAero;
        op.aeroPowerW = tAero * wr;
        op.tipSpeedRatio = windMPerS > 0.0 ? wr * p.rotorRadiusM / windMPerS : 0.0;
        op.cp = windMPerS > 0.0 ? op.aeroPowerW / (0.5 * p.airDensityKgPerM3 * Math.PI * p.rotorRadiusM * p.rotorRadiusM
                * windMPerS * windMPerS * windMPerS) : 0.0;

        // drivetrain and generator
        final double tLss = tAero - b * wr;
        op.shaftTorqueNm = tLss;
        op.shaftTwistRad = p.twoMass ? tLss / p.shaftStiffnessNmPerRad : 0.0;
        op.generatorTorqueNm = tLss / n;
        op.generatorSpeedRadPerS = wr * n;
        final double we = p.polePairs * n * wr;
        op.generatorElectricalSpeedRadPerS = we;
        final double iq = op.generatorTorqueNm / (1.5 * p.polePairs * p.magnetFluxWb);
        final double id = 0.0;
        final double rs = p.statorResistanceOhm;
        op.statorCurrentDA = id;
        op.statorCurrentQA = iq;
        op.statorVoltageDV = -rs * id + we * p.qAxisInductanceH * iq;
        op.statorVoltageQV = -rs * iq - we * p.dAxisInductanceH * id + we * p.magnetFluxWb;
        op.statorPowerW = 1.5 * (op.statorVoltageDV * id + op.statorVoltageQV * iq);
        op.statorCopperLossW = 1.5 * rs * (id * id + iq * iq);
        op.frictionLossW = b * wr * wr;
        op.dcLinkVoltageV = p.dcVoltageNominalV;

        // grid side
        final GridNetwork net = new GridNetwork(p);
        final PerUnitBase base = PerUnitBase.gridSide(p);
        final double omega = 2.0 * Math.PI * p.gridFrequencyHz;
        final double e = gridVoltagePu * base.voltagePeakV;
        final double rd = net.downstreamResistanceOhm();
        final double xd = omega * net.downstreamInductanceH();
        final double rf = net.chokeResistanceOhm;
        final double xf = omega * net.chokeInductanceH;
        final double qTerm = reactivePowerPu * p.ratedPowerW;
        double u = 0.0;
        double pTerm = op.statorPowerW;
        for (int i = 0; i < 200; i++) {
            pTerm = op.statorPowerW - 1.5 * rf * u;
            double pp = pTerm / 1.5;
            double qq = qTerm / 1.5;
            double z2 = rd * rd + xd * xd;
            double bq = e * e + 2.0 * pp * rd + 2.0 * qq * xd;
            double s2 = pp * pp + qq * qq;
            double disc = bq * bq - 4.0 * z2 * s2;
            if (!(disc >= 0.0) || !(bq > 0.0)) {
                throw new IllegalArgumentException("grid: the network cannot carry " + Math.round(pTerm) + " W and "
                        + Math.round(qTerm) + " var at " + gridVoltagePu + " pu source voltage");
            }
            double next = s2 == 0.0 ? 0.0 : 2.0 * s2 / (bq + Math.sqrt(disc));
            if (Math.abs(next - u) <= 1e-15 * Math.max(1.0, next)) {
                u = next;
                break;
            }
            u = next;
        }
        pTerm = op.statorPowerW - 1.5 * rf * u;
        final double x = (pTerm / 1.5 - rd * u) / e;
        final double y = (xd * u - qTerm / 1.5) / e;
        op.gridCurrentDA = x;
        op.gridCurrentQA = y;
        op.sourceVoltageDV = e;
        op.terminalVoltageDV = e + rd * x - xd * y;
        op.terminalVoltageQV = rd * y + xd * x;
        op.converterVoltageDV = op.terminalVoltageDV + rf * x - xf * y;
        op.converterVoltageQV = op.terminalVoltageQV + rf * y + xf * x;
        final double rg = net.gridResistanceOhm;
        final double xg = omega * net.gridInductanceH;
        op.pocVoltageDV = e + rg * x - xg * y;
        op.pocVoltageQV = rg * y + xg * x;
        op.gridPowerW = 1.5 * (op.terminalVoltageDV * x + op.terminalVoltageQV * y);
        op.gridReactivePowerVar = 1.5 * (op.terminalVoltageQV * x - op.terminalVoltageDV * y);
        op.pocPowerW = 1.5 * (op.pocVoltageDV * x + op.pocVoltageQV * y);
        op.pocReactivePowerVar = 1.5 * (op.pocVoltageQV * x - op.pocVoltageDV * y);
        op.terminalVoltagePu = Math.hypot(op.terminalVoltageDV, op.terminalVoltageQV) / base.voltagePeakV;
        op.pocVoltagePu = Math.hypot(op.pocVoltageDV, op.pocVoltageQV) / base.voltagePeakV;
        op.chokeLossW = 1.5 * rf * (x * x + y * y);
        op.transformerLossW = 1.5 * (net.converterTransformerResistanceOhm + net.plantTransformerResistanceOhm) * (x * x + y * y);
        op.lossesW = op.statorCopperLossW + op.chokeLossW + op.transformerLossW + op.frictionLossW;

        final double vLimit = p.dcVoltageNominalV / Math.sqrt(3.0);
        op.mscModulation = Math.hypot(op.statorVoltageDV, op.statorVoltageQV) / vLimit;
        op.gscModulation = Math.hypot(op.converterVoltageDV, op.converterVoltageQV) / vLimit;
        BoardCommand c = new BoardCommand();
        op.fillCommand(c, 0.0, 0.0, p.dcVoltageNominalV);
        op.mscDutyA = c.mscDutyA; op.mscDutyB = c.mscDutyB; op.mscDutyC = c.mscDutyC;
        op.gscDutyA = c.gscDutyA; op.gscDutyB = c.gscDutyB; op.gscDutyC = c.gscDutyC;
        return op;
    }

    /**
     * The settled point whose reactive power holds the terminal voltage at
     * {@code terminalVoltagePu} (e.g. 1.0 on a weak grid, where unity power factor at the
     * terminal would let the voltage sag). The terminal voltage rises with capacitive Q; the
     * Q in -2..2 pu is found by a scan for a sign change over the solvable range and bisection.
     *
     * @throws IllegalArgumentException when no Q in -2..2 pu reaches the voltage
     */
    public static OperatingPoint solveAtTerminalVoltage(TurbineParameters p, double windMPerS, double gridVoltagePu,
                                                        double terminalVoltagePu) {
        if (!(terminalVoltagePu >= 0.1 && terminalVoltagePu <= 2.0)) {
            throw new IllegalArgumentException("terminal voltage: must be within 0.1..2 pu, got " + terminalVoltagePu);
        }
        double prevQ = Double.NaN;
        double prevErr = Double.NaN;
        for (int i = 0; i <= 400; i++) {
            double q = -2.0 + 0.01 * i;
            double err;
            try {
                err = solve(p, windMPerS, gridVoltagePu, q).terminalVoltagePu - terminalVoltagePu;
            } catch (IllegalArgumentException notCarried) {
                prevQ = Double.NaN;
                continue;
            }
            if (err == 0.0) {
                return solve(p, windMPerS, gridVoltagePu, q);
            }
            if (prevQ == prevQ && (prevErr < 0.0) != (err < 0.0)) {
                double lo = prevQ;
                double hi = q;
                boolean loNegative = prevErr < 0.0;
                for (int k = 0; k < 100; k++) {
                    double mid = 0.5 * (lo + hi);
                    boolean negative = solve(p, windMPerS, gridVoltagePu, mid).terminalVoltagePu - terminalVoltagePu < 0.0;
                    if (negative == loNegative) {
                        lo = mid;
                    } else {
                        hi = mid;
                    }
                }
                return solve(p, windMPerS, gridVoltagePu, 0.5 * (lo + hi));
            }
            prevQ = q;
            prevErr = err;
        }
        throw new IllegalArgumentException("terminal voltage: no reactive power within -2..2 pu holds " + terminalVoltagePu
                + " pu at " + windMPerS + " m/s and " + gridVoltagePu + " pu grid voltage");
    }

    /** Aerodynamic torque with the plant's guards (see {@link TurbinePlant#aeroTorque}). */
    static final class Aero {
        private final CpSurface cps;
        private final double torqueFactor; // 1/2 rho pi R^3
        private final double radiusM;

        Aero(TurbineParameters p, CpSurface cps) {
            this.cps = cps;
            this.radiusM = p.rotorRadiusM;
            this.torqueFactor = 0.5 * p.airDensityKgPerM3 * Math.PI * p.rotorRadiusM * p.rotorRadiusM * p.rotorRadiusM;
        }

        double torque(double rotorSpeedRadPerS, double pitchRad, double windMPerS) {
            return TurbinePlant.aeroTorque(cps, torqueFactor, radiusM, rotorSpeedRadPerS, pitchRad, windMPerS);
        }
    }
}
