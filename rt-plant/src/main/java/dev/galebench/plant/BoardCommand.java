package dev.galebench.plant;

/**
 * What the board commands at one exchange: per-phase duty cycles of both converters, the
 * chopper duty, the pitch reference and command bits. One instance per run, overwritten in
 * place; the plant reads it at every step (zero-order hold between exchanges).
 *
 * <p>Duty convention: {@code d} in [0, 1] is the fraction of the switching period in which the
 * upper switch of that leg conducts. The switching-cycle average of the leg voltage against
 * the DC midpoint is {@code (2 d - 1) * Vdc / 2}. The plant has no neutral connection, so the
 * common-mode part of the three leg voltages drives no current.
 *
 * <table>
 *   <caption>Fields</caption>
 *   <tr><th>field</th><th>unit</th><th>range</th><th>meaning</th></tr>
 *   <tr><td>mscDutyA..C</td><td>1</td><td>0..1</td><td>machine-side converter leg duties</td></tr>
 *   <tr><td>gscDutyA..C</td><td>1</td><td>0..1</td><td>grid-side converter leg duties</td></tr>
 *   <tr><td>chopperDuty</td><td>1</td><td>0..1</td><td>braking-chopper duty (averaged)</td></tr>
 *   <tr><td>pitchRefRad</td><td>rad</td><td>plant pitch limits</td><td>blade pitch reference</td></tr>
 *   <tr><td>commandFlags</td><td>bits</td><td></td><td>see {@code CMD_*}</td></tr>
 *   <tr><td>boardStatus</td><td>bits</td><td></td><td>the board's own status word, recorded as is</td></tr>
 *   <tr><td>answeredSequence</td><td>1</td><td>&ge; 0, or -1</td><td>sequence number of the measurement frame this command answers; -1 before any reply</td></tr>
 * </table>
 */
public final class BoardCommand {
    /** Enable the machine-side converter gates. */
    public static final int CMD_MSC_ENABLE = 1;
    /** Enable the grid-side converter gates. */
    public static final int CMD_GSC_ENABLE = 1 << 1;
    /** Close (1) or open (0) the grid breaker. */
    public static final int CMD_BREAKER_CLOSE = 1 << 2;
    /** Request a reset of latched trips (edge-triggered by the plant). */
    public static final int CMD_TRIP_RESET = 1 << 3;

    /** boardStatus bit: the controller is running (converters under control). */
    public static final int BOARD_RUNNING = 1;
    /** boardStatus bit: fault ride-through is active. */
    public static final int BOARD_FRT_ACTIVE = 1 << 1;
    /** boardStatus bit: the controller's own protection tripped (see the board's log). */
    public static final int BOARD_TRIPPED = 1 << 2;
    /** boardStatus bit: pitch control is active (above rated). */
    public static final int BOARD_PITCH_ACTIVE = 1 << 3;
    /** boardStatus bit: the controller commands the braking chopper. */
    public static final int BOARD_CHOPPER_ON = 1 << 4;
    /** boardStatus bit: the PLL is locked. */
    public static final int BOARD_PLL_LOCKED = 1 << 5;

    public double mscDutyA, mscDutyB, mscDutyC;
    public double gscDutyA, gscDutyB, gscDutyC;
    public double chopperDuty;
    public double pitchRefRad;
    public int commandFlags;
    public int boardStatus;
    public long answeredSequence = -1;

    /** Copies every field of {@code other} into this command (no allocation). */
    public void copyFrom(BoardCommand other) {
        mscDutyA = other.mscDutyA; mscDutyB = other.mscDutyB; mscDutyC = other.mscDutyC;
        gscDutyA = other.gscDutyA; gscDutyB = other.gscDutyB; gscDutyC = other.gscDutyC;
        chopperDuty = other.chopperDuty;
        pitchRefRad = other.pitchRefRad;
        commandFlags = other.commandFlags;
        boardStatus = other.boardStatus;
        answeredSequence = other.answeredSequence;
    }

    /** Gates off, breaker kept as given, duties at 0.5 (zero average leg voltage). */
    public void block(boolean breakerClosed) {
        mscDutyA = mscDutyB = mscDutyC = 0.5;
        gscDutyA = gscDutyB = gscDutyC = 0.5;
        chopperDuty = 0.0;
        commandFlags = breakerClosed ? CMD_BREAKER_CLOSE : 0;
    }
}
