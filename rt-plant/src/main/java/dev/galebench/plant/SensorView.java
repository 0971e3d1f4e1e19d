package dev.galebench.plant;

/**
 * What a converter-controller board's sensors see at one exchange: the plant writes it,
 * a {@code BoardLink} encodes it onto the wire. One instance is allocated before a run and
 * overwritten in place at every exchange; fields are public primitives so the real-time
 * thread reads and writes them without calls or boxing.
 *
 * <p>Conventions (documented once, used everywhere):
 * <ul>
 *   <li>SI units, as the field names say. Phase quantities are instantaneous values.</li>
 *   <li>Grid-side voltages are phase-to-neutral at the converter's grid-side filter terminal
 *       (low-voltage side of the converter transformer); grid-side currents flow from the
 *       converter towards the grid.</li>
 *   <li>Generator currents are in generator convention (flowing out of the stator into the
 *       machine-side converter).</li>
 *   <li>dq values (for bring-up only) use the amplitude-invariant Park transform with q leading
 *       d: grid quantities in the frame of the plant's true grid-source angle, generator
 *       quantities in the rotor frame (d axis on the magnet flux).</li>
 *   <li>Measured quantities have passed the anti-alias filters of the measurement front end.</li>
 * </ul>
 *
 * <table>
 *   <caption>Fields</caption>
 *   <tr><th>field</th><th>unit</th><th>meaning</th></tr>
 *   <tr><td>plantTimeNs</td><td>ns</td><td>plant time of this measurement (k * step)</td></tr>
 *   <tr><td>gridVoltageAV..C</td><td>V</td><td>grid-side phase-to-neutral voltages at the filter terminal</td></tr>
 *   <tr><td>gridCurrentAA..C</td><td>A</td><td>grid-side converter phase currents</td></tr>
 *   <tr><td>statorVoltageAV..C</td><td>V</td><td>generator terminal phase-to-neutral voltages</td></tr>
 *   <tr><td>statorCurrentAA..C</td><td>A</td><td>generator phase currents</td></tr>
 *   <tr><td>dcLinkVoltageV</td><td>V</td><td>DC-link voltage</td></tr>
 *   <tr><td>rotorAngleRad</td><td>rad</td><td>mechanical rotor angle, wrapped to [0, 2 pi) (encoder)</td></tr>
 *   <tr><td>rotorSpeedRadPerS</td><td>rad/s</td><td>mechanical generator speed</td></tr>
 *   <tr><td>windSpeedMPerS</td><td>m/s</td><td>hub-height wind speed (nacelle anemometer)</td></tr>
 *   <tr><td>pitchAngleRad</td><td>rad</td><td>measured blade pitch angle</td></tr>
 *   <tr><td>gridVoltageDV, gridVoltageQV</td><td>V</td><td>grid voltage in dq (bring-up)</td></tr>
 *   <tr><td>gridCurrentDA, gridCurrentQA</td><td>A</td><td>grid current in dq (bring-up)</td></tr>
 *   <tr><td>statorCurrentDA, statorCurrentQA</td><td>A</td><td>generator current in rotor dq (bring-up)</td></tr>
 *   <tr><td>statorVoltageDV, statorVoltageQV</td><td>V</td><td>generator voltage in rotor dq (bring-up)</td></tr>
 *   <tr><td>voltageDeviationRefPu</td><td>pu</td><td>reference from the plant-level controller: wanted deviation of the terminal voltage (positive = more reactive power out)</td></tr>
 *   <tr><td>statusFlags</td><td>bits</td><td>see the {@code STATUS_*} constants</td></tr>
 * </table>
 */
public final class SensorView {
    /** Grid breaker is closed. */
    public static final int STATUS_BREAKER_CLOSED = 1;
    /** Machine-side converter gates are blocked (by command or by protection). */
    public static final int STATUS_MSC_BLOCKED = 1 << 1;
    /** Grid-side converter gates are blocked (by command or by protection). */
    public static final int STATUS_GSC_BLOCKED = 1 << 2;
    /** The braking chopper conducted during the last step. */
    public static final int STATUS_CHOPPER_ON = 1 << 3;
    /** Hardware trip: DC-link overvoltage. Latched until reset. */
    public static final int TRIP_DC_OVERVOLTAGE = 1 << 8;
    /** Hardware trip: machine-side converter overcurrent. Latched until reset. */
    public static final int TRIP_MSC_OVERCURRENT = 1 << 9;
    /** Hardware trip: grid-side converter overcurrent. Latched until reset. */
    public static final int TRIP_GSC_OVERCURRENT = 1 << 10;
    /** Link watchdog: the board was silent for longer than the watchdog time. Latched until reset. */
    public static final int TRIP_LINK_WATCHDOG = 1 << 11;
    /** Rotor overspeed (mechanical protection of the plant model). Latched until reset. */
    public static final int TRIP_OVERSPEED = 1 << 12;
    /** Mask of all trip bits. */
    public static final int TRIP_MASK = 0xFF00;

    public long plantTimeNs;
    public double gridVoltageAV, gridVoltageBV, gridVoltageCV;
    public double gridCurrentAA, gridCurrentBA, gridCurrentCA;
    public double statorVoltageAV, statorVoltageBV, statorVoltageCV;
    public double statorCurrentAA, statorCurrentBA, statorCurrentCA;
    public double dcLinkVoltageV;
    public double rotorAngleRad;
    public double rotorSpeedRadPerS;
    public double windSpeedMPerS;
    public double pitchAngleRad;
    public double gridVoltageDV, gridVoltageQV;
    public double gridCurrentDA, gridCurrentQA;
    public double statorCurrentDA, statorCurrentQA;
    public double statorVoltageDV, statorVoltageQV;
    public double voltageDeviationRefPu;
    public int statusFlags;

    /** Copies every field of {@code other} into this view (no allocation). */
    public void copyFrom(SensorView other) {
        plantTimeNs = other.plantTimeNs;
        gridVoltageAV = other.gridVoltageAV; gridVoltageBV = other.gridVoltageBV; gridVoltageCV = other.gridVoltageCV;
        gridCurrentAA = other.gridCurrentAA; gridCurrentBA = other.gridCurrentBA; gridCurrentCA = other.gridCurrentCA;
        statorVoltageAV = other.statorVoltageAV; statorVoltageBV = other.statorVoltageBV; statorVoltageCV = other.statorVoltageCV;
        statorCurrentAA = other.statorCurrentAA; statorCurrentBA = other.statorCurrentBA; statorCurrentCA = other.statorCurrentCA;
        dcLinkVoltageV = other.dcLinkVoltageV;
        rotorAngleRad = other.rotorAngleRad;
        rotorSpeedRadPerS = other.rotorSpeedRadPerS;
        windSpeedMPerS = other.windSpeedMPerS;
        pitchAngleRad = other.pitchAngleRad;
        gridVoltageDV = other.gridVoltageDV; gridVoltageQV = other.gridVoltageQV;
        gridCurrentDA = other.gridCurrentDA; gridCurrentQA = other.gridCurrentQA;
        statorCurrentDA = other.statorCurrentDA; statorCurrentQA = other.statorCurrentQA;
        statorVoltageDV = other.statorVoltageDV; statorVoltageQV = other.statorVoltageQV;
        voltageDeviationRefPu = other.voltageDeviationRefPu;
        statusFlags = other.statusFlags;
    }
}
