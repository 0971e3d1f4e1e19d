package dev.galebench.testsupport;

import dev.galebench.check.SignalIndex;

/** Signal layouts for tests: the documented names of /work/wt/SIGNALS.md plus the runner's board and timing signals. */
public final class Layouts {
    private static final String[][] DOCUMENTED = {
        {"wind_m_s", "m/s"}, {"rotor_speed_rad_s", "rad/s"}, {"generator_speed_rad_s", "rad/s"}, {"pitch_deg", "deg"},
        {"tip_speed_ratio", "1"}, {"cp", "1"}, {"p_aero_w", "W"}, {"t_aero_nm", "N m"}, {"t_gen_nm", "N m"},
        {"t_shaft_nm", "N m"}, {"v_dc_v", "V"}, {"p_chopper_w", "W"}, {"i_stator_a_a", "A"}, {"i_stator_b_a", "A"},
        {"i_stator_c_a", "A"}, {"i_stator_d_a", "A"}, {"i_stator_q_a", "A"}, {"v_stator_d_v", "V"},
        {"v_stator_q_v", "V"}, {"p_stator_w", "W"}, {"v_term_a_v", "V"}, {"v_term_b_v", "V"}, {"v_term_c_v", "V"},
        {"i_grid_a_a", "A"}, {"i_grid_b_a", "A"}, {"i_grid_c_a", "A"}, {"v_term_d_v", "V"}, {"v_term_q_v", "V"},
        {"i_grid_d_a", "A"}, {"i_grid_q_a", "A"}, {"v_term_pu", "pu"}, {"v_term_neg_pu", "pu"},
        {"i_active_pu", "pu"}, {"i_reactive_pu", "pu"}, {"p_grid_w", "W"}, {"q_grid_var", "var"},
        {"p_grid_pu", "pu"}, {"q_grid_pu", "pu"}, {"p_poc_w", "W"}, {"q_poc_var", "var"}, {"v_poc_pu", "pu"},
        {"v_source_pu", "pu"}, {"grid_frequency_hz", "Hz"}, {"losses_w", "W"}, {"trip_flags", "1"},
        {"status_flags", "1"},
        {"board_status", "1"}, {"frt_active", "1"}, {"msc_duty_a", "1"}, {"msc_duty_b", "1"}, {"msc_duty_c", "1"},
        {"gsc_duty_a", "1"}, {"gsc_duty_b", "1"}, {"gsc_duty_c", "1"}, {"chopper_duty", "1"},
        {"pitch_ref_deg", "deg"}, {"v_dev_ref_pu", "pu"}, {"lateness_us", "us"}, {"compute_us", "us"},
        {"rtt_us", "us"}, {"reply_age", "1"},
    };

    private Layouts() {
    }

    /** Every documented signal, in the order above. */
    public static SignalIndex documented() {
        String[] n = new String[DOCUMENTED.length], u = new String[DOCUMENTED.length];
        for (int i = 0; i < n.length; i++) {
            n[i] = DOCUMENTED[i][0];
            u[i] = DOCUMENTED[i][1];
        }
        return new SignalIndex(n, u);
    }

    /** A small layout with just the given names (unit "pu" for all). */
    public static SignalIndex of(String... names) {
        String[] u = new String[names.length];
        java.util.Arrays.fill(u, "pu");
        return new SignalIndex(names, u);
    }
}
