package dev.galebench.plant;

/**
 * Per-unit bases for amplitude-invariant dq quantities, as listed in the project references
 * (REFERENCES.md section 5, common practice): {@code V_b} is the peak phase voltage, so that
 * in per unit {@code P = v_d i_d + v_q i_q} without the factor 1.5.
 *
 * <table>
 *   <caption>Bases</caption>
 *   <tr><th>field</th><th>unit</th><th>definition</th></tr>
 *   <tr><td>powerVA</td><td>VA</td><td>S_b (the turbine's rated power)</td></tr>
 *   <tr><td>lineVoltageRmsV</td><td>V</td><td>V_LL rms (nameplate)</td></tr>
 *   <tr><td>voltagePeakV</td><td>V</td><td>V_b = sqrt(2) V_LL / sqrt(3)</td></tr>
 *   <tr><td>currentPeakA</td><td>A</td><td>I_b = 2 S_b / (3 V_b) = sqrt(2) I_n</td></tr>
 *   <tr><td>currentRmsA</td><td>A</td><td>I_n = S_b / (sqrt(3) V_LL)</td></tr>
 *   <tr><td>impedanceOhm</td><td>ohm</td><td>Z_b = V_LL^2 / S_b</td></tr>
 *   <tr><td>angularFrequencyRadPerS</td><td>rad/s</td><td>omega_b (electrical)</td></tr>
 *   <tr><td>inductanceH</td><td>H</td><td>L_b = Z_b / omega_b</td></tr>
 *   <tr><td>capacitanceF</td><td>F</td><td>C_b = 1 / (omega_b Z_b)</td></tr>
 *   <tr><td>fluxWb</td><td>Wb</td><td>psi_b = V_b / omega_b</td></tr>
 *   <tr><td>dcVoltageV</td><td>V</td><td>V_dc,b = 2 V_b (m = 1 gives V_dc/2 = V_b)</td></tr>
 *   <tr><td>mechanicalSpeedRadPerS</td><td>rad/s</td><td>omega_m,b (rated rotor speed of the shaft this base is for)</td></tr>
 *   <tr><td>torqueNm</td><td>N m</td><td>T_b = S_b / omega_m,b</td></tr>
 * </table>
 */
public final class PerUnitBase {
    public final double powerVA;
    public final double lineVoltageRmsV;
    public final double voltagePeakV;
    public final double currentPeakA;
    public final double currentRmsA;
    public final double impedanceOhm;
    public final double angularFrequencyRadPerS;
    public final double inductanceH;
    public final double capacitanceF;
    public final double fluxWb;
    public final double dcVoltageV;
    public final double mechanicalSpeedRadPerS;
    public final double torqueNm;

    /**
     * @param powerVA S_b
     * @param lineVoltageRmsV V_LL rms
     * @param angularFrequencyRadPerS electrical base angular frequency
     * @param mechanicalSpeedRadPerS mechanical base speed (for torque and inertia constants)
     */
    public PerUnitBase(double powerVA, double lineVoltageRmsV, double angularFrequencyRadPerS,
                       double mechanicalSpeedRadPerS) {
        this.powerVA = powerVA;
        this.lineVoltageRmsV = lineVoltageRmsV;
        this.voltagePeakV = Math.sqrt(2.0) * lineVoltageRmsV / Math.sqrt(3.0);
        this.currentPeakA = 2.0 * powerVA / (3.0 * voltagePeakV);
        this.currentRmsA = powerVA / (Math.sqrt(3.0) * lineVoltageRmsV);
        this.impedanceOhm = lineVoltageRmsV * lineVoltageRmsV / powerVA;
        this.angularFrequencyRadPerS = angularFrequencyRadPerS;
        this.inductanceH = impedanceOhm / angularFrequencyRadPerS;
        this.capacitanceF = 1.0 / (angularFrequencyRadPerS * impedanceOhm);
        this.fluxWb = voltagePeakV / angularFrequencyRadPerS;
        this.dcVoltageV = 2.0 * voltagePeakV;
        this.mechanicalSpeedRadPerS = mechanicalSpeedRadPerS;
        this.torqueNm = powerVA / mechanicalSpeedRadPerS;
    }

    /** Grid side: S_b = rated power, V_LL = converter-transformer LV voltage, omega_b = 2 pi f_grid, omega_m,b = rated rotor speed. */
    public static PerUnitBase gridSide(TurbineParameters p) {
        return new PerUnitBase(p.ratedPowerW, p.lvVoltageV, 2.0 * Math.PI * p.gridFrequencyHz, p.ratedRotorSpeedRadPerS);
    }

    /**
     * Generator side: S_b = rated power, V_LL = generator rated voltage, omega_b = rated
     * electrical angular frequency p * N * omega_rated, omega_m,b = rated generator speed.
     */
    public static PerUnitBase generatorSide(TurbineParameters p) {
        double genSpeed = p.ratedRotorSpeedRadPerS * p.gearRatio;
        return new PerUnitBase(p.ratedPowerW, p.ratedStatorVoltageV, p.polePairs * genSpeed, genSpeed);
    }

    /** Inertia constant H = J omega_m,b^2 / (2 S_b), s, for an inertia on the shaft this base is for. */
    public double inertiaConstantS(double inertiaKgM2) {
        return inertiaKgM2 * mechanicalSpeedRadPerS * mechanicalSpeedRadPerS / (2.0 * powerVA);
    }

    public double impedanceToPu(double ohm) {
        return ohm / impedanceOhm;
    }

    public double inductanceToPu(double henry) {
        return henry / inductanceH;
    }

    public double voltageToPu(double peakPhaseV) {
        return peakPhaseV / voltagePeakV;
    }

    public double currentToPu(double peakA) {
        return peakA / currentPeakA;
    }

    public double powerToPu(double watt) {
        return watt / powerVA;
    }
}
