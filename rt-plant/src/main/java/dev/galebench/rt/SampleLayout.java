package dev.galebench.rt;

import dev.galebench.plant.PlantModel;

import java.util.Arrays;

/**
 * Which signal sits in which slot of a {@link Sample}: first the plant's own signals in the
 * order of {@link PlantModel#signalName}, then the board-side and loop-timing signals the loop
 * appends at every exchange (names as in the project's signal list):
 *
 * <table>
 *   <caption>Appended signals</caption>
 *   <tr><th>name</th><th>unit</th><th>meaning</th></tr>
 *   <tr><td>board_status</td><td>bits</td><td>the board's status word of the command in force</td></tr>
 *   <tr><td>frt_active</td><td>1</td><td>0/1, the FRT bit of board_status</td></tr>
 *   <tr><td>msc_duty_a..c, gsc_duty_a..c, chopper_duty</td><td>1</td><td>duties in force (after supervision)</td></tr>
 *   <tr><td>pitch_ref_deg</td><td>deg</td><td>pitch reference in force</td></tr>
 *   <tr><td>v_dev_ref_pu</td><td>pu</td><td>plant-level voltage-deviation reference sent to the board</td></tr>
 *   <tr><td>lateness_us</td><td>us</td><td>start of this exchange minus its deadline</td></tr>
 *   <tr><td>compute_us</td><td>us</td><td>step hook plus M plant steps</td></tr>
 *   <tr><td>rtt_us</td><td>us</td><td>round trip of the reply accepted since the last exchange, NaN if none</td></tr>
 *   <tr><td>reply_age</td><td>exchanges</td><td>last sent sequence minus the sequence the command in force answers</td></tr>
 * </table>
 *
 * Immutable; the arrays handed out are copies.
 */
public final class SampleLayout {
    /** Names of the appended signals, in slot order after the plant's. */
    public static final String[] LOOP_SIGNAL_NAMES = {
        "board_status", "frt_active", "msc_duty_a", "msc_duty_b", "msc_duty_c",
        "gsc_duty_a", "gsc_duty_b", "gsc_duty_c", "chopper_duty", "pitch_ref_deg", "v_dev_ref_pu",
        "lateness_us", "compute_us", "rtt_us", "reply_age"};
    /** Units of the appended signals. */
    public static final String[] LOOP_SIGNAL_UNITS = {
        "bits", "1", "1", "1", "1", "1", "1", "1", "1", "deg", "pu", "us", "us", "us", "exchanges"};

    static final int BOARD_STATUS = 0;
    static final int FRT_ACTIVE = 1;
    static final int MSC_DUTY_A = 2;
    static final int GSC_DUTY_A = 5;
    static final int CHOPPER_DUTY = 8;
    static final int PITCH_REF_DEG = 9;
    static final int V_DEV_REF_PU = 10;
    static final int LATENESS_US = 11;
    static final int COMPUTE_US = 12;
    static final int RTT_US = 13;
    static final int REPLY_AGE = 14;

    private final String[] names;
    private final String[] units;
    private final int plantSignalCount;

    private SampleLayout(String[] names, String[] units, int plantSignalCount) {
        this.names = names;
        this.units = units;
        this.plantSignalCount = plantSignalCount;
    }

    /** The layout for {@code plant}: its signals, then the appended ones. */
    public static SampleLayout of(PlantModel plant) {
        final int n = plant.signalCount();
        final int total = n + LOOP_SIGNAL_NAMES.length;
        String[] names = new String[total];
        String[] units = new String[total];
        for (int i = 0; i < n; i++) {
            names[i] = plant.signalName(i);
            units[i] = plant.signalUnit(i);
        }
        System.arraycopy(LOOP_SIGNAL_NAMES, 0, names, n, LOOP_SIGNAL_NAMES.length);
        System.arraycopy(LOOP_SIGNAL_UNITS, 0, units, n, LOOP_SIGNAL_UNITS.length);
        for (int i = 0; i < total; i++) {
            for (int j = 0; j < i; j++) {
                if (names[i].equals(names[j])) {
                    throw new IllegalArgumentException("sample layout: signal name '" + names[i] + "' appears twice (slots " + j + " and " + i + ")");
                }
            }
        }
        return new SampleLayout(names, units, n);
    }

    /** Number of slots per sample. */
    public int signalCount() {
        return names.length;
    }

    /** Number of leading slots written by the plant. */
    public int plantSignalCount() {
        return plantSignalCount;
    }

    /** Slot of {@code name}, or -1. */
    public int indexOf(String name) {
        for (int i = 0; i < names.length; i++) {
            if (names[i].equals(name)) {
                return i;
            }
        }
        return -1;
    }

    public String name(int index) {
        return names[index];
    }

    public String unit(int index) {
        return units[index];
    }

    /** Copy of all names in slot order. */
    public String[] names() {
        return names.clone();
    }

    /** Copy of all units in slot order. */
    public String[] units() {
        return units.clone();
    }

    @Override
    public String toString() {
        return "SampleLayout" + Arrays.toString(names);
    }
}
