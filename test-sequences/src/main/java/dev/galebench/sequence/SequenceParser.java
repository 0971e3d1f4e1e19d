package dev.galebench.sequence;

import dev.galebench.check.BandCheck;
import dev.galebench.check.Condition;
import dev.galebench.check.EnvelopeCheck;
import dev.galebench.check.EventAfterCheck;
import dev.galebench.check.FlagsCheck;
import dev.galebench.check.LinkHealthCheck;
import dev.galebench.check.OvershootCheck;
import dev.galebench.check.PowerRecoveryCheck;
import dev.galebench.check.ReactiveCurrentCheck;
import dev.galebench.check.RiseTimeCheck;
import dev.galebench.check.SettleCheck;
import dev.galebench.check.TimingCheck;
import java.io.IOException;
import java.io.Reader;
import java.io.StringReader;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.regex.Pattern;
import org.yaml.snakeyaml.LoaderOptions;
import org.yaml.snakeyaml.Yaml;
import org.yaml.snakeyaml.error.Mark;
import org.yaml.snakeyaml.error.MarkedYAMLException;
import org.yaml.snakeyaml.nodes.Node;
import org.yaml.snakeyaml.nodes.SequenceNode;

/**
 * Reads a sequence file (format 1, see {@code test-sequences/README.md}) with SnakeYAML's node
 * API, so every error names file, line and column. Validates everything that does not need the
 * plant: key names, types, ranges, check windows, and the timeline (actions on the same track
 * must not overlap; nothing may act after the end of the run). Unknown signal names are found
 * later, when the runner knows the run's signal layout ({@link SequenceChecks#bind}).
 */
public final class SequenceParser {
    /** The one file format version this parser reads. */
    public static final int FORMAT = 1;
    private static final Pattern NAME = Pattern.compile("[a-z0-9][a-z0-9-]{0,63}");
    private static final String[] ACTION_KINDS = {"wind_step", "wind_ramp", "wind_gust", "turbulence", "grid_dip",
        "grid_swell", "phase_jump", "frequency_step", "frequency_ramp", "grid_strength", "voltage_ref_step",
        "link_fault"};
    private static final String[] CHECK_KINDS = {"band", "settle", "rise_time", "overshoot", "event_after",
        "envelope", "reactive_current", "power_recovery", "timing", "link_health", "flags"};

    private SequenceParser() {
    }

    /** Parses a file; relative turbine/controller paths resolve against its directory. */
    public static Sequence parseFile(Path file) {
        String text;
        try {
            text = Files.readString(file, StandardCharsets.UTF_8);
        } catch (NoSuchFileException e) {
            throw new SequenceException(new SourceMark(file.toString(), 1, 1), "no such file");
        } catch (IOException e) {
            throw new UncheckedIOException(file + ": " + e.getMessage(), e);
        }
        Path dir = file.toAbsolutePath().getParent();
        return parse(file.toString(), text, dir);
    }

    /** Parses {@code text}; {@code label} names the source in messages. */
    public static Sequence parse(String label, String text, Path baseDir) {
        Node root;
        try (Reader r = new StringReader(text)) {
            LoaderOptions opts = new LoaderOptions();
            opts.setAllowDuplicateKeys(false);
            root = new Yaml(opts).compose(r);
        } catch (MarkedYAMLException e) {
            Mark m = e.getProblemMark() != null ? e.getProblemMark() : e.getContextMark();
            SourceMark at = m == null ? new SourceMark(label, 1, 1) : new SourceMark(label, m.getLine() + 1, m.getColumn() + 1);
            String why = (e.getProblem() != null ? e.getProblem() : e.getMessage());
            throw new SequenceException(at, "not valid YAML: " + why
                    + (e.getContext() != null ? " (" + e.getContext() + ")" : ""));
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        if (root == null) {
            throw new SequenceException(new SourceMark(label, 1, 1), "the file is empty");
        }
        return new SequenceParser.Reading(label, baseDir).sequence(YamlObject.of(label, root, "the sequence file"));
    }

    /** State of one parse. */
    private static final class Reading {
        private final String label;
        private final Path baseDir;
        private double durationS;

        Reading(String label, Path baseDir) {
            this.label = label;
            this.baseDir = baseDir;
        }

        Sequence sequence(YamlObject top) {
            top.allowOnly("format", "name", "purpose", "turbine", "controller", "initial", "timing", "duration_s",
                    "allow_trips", "actions", "checks");
            long format = top.integer("format", FORMAT, 0, Integer.MAX_VALUE);
            if (format != FORMAT) {
                throw new SequenceException(top.markOf("format"), "format " + format + " is not supported; this "
                        + "galebench reads format " + FORMAT);
            }
            String name = top.text("name");
            if (!NAME.matcher(name).matches()) {
                throw new SequenceException(top.markOf("name"), "name '" + name + "' must be lower case letters, "
                        + "digits and dashes (up to 64), starting with a letter or digit");
            }
            String purpose = top.text("purpose").trim();
            String turbine = top.text("turbine", "default");
            String controller = top.text("controller", "default");
            Sequence.Initial initial = initial(top.object("initial"));
            double stepUs = 50;
            int exchangeEvery = 1;
            double watchdogUs = 20_000;
            if (top.has("timing")) {
                YamlObject t = top.object("timing");
                t.allowOnly("step_us", "exchange_every", "watchdog_us");
                watchdogUs = t.number("watchdog_us", 20_000, 1, 10_000_000, "us");
                stepUs = t.number("step_us", 50, 1, 1000, "us");
                if (Math.abs(stepUs * 1000 - Math.rint(stepUs * 1000)) > 1e-6) {
                    throw new SequenceException(t.markOf("step_us"), "step_us must be a whole number of ns");
                }
                exchangeEvery = (int) t.integer("exchange_every", 1, 1, 10_000);
            }
            durationS = top.number("duration_s", 1e-3, 24 * 3600, "s");
            List<String> trips = new ArrayList<>();
            for (Node n : top.list("allow_trips")) {
                trips.add(tripName(n));
            }
            List<Action> actions = new ArrayList<>();
            for (Node n : top.list("actions")) {
                actions.add(action(YamlObject.of(label, n, "an action")));
            }
            actions.sort(Comparator.comparingDouble(Action::atS));
            Timeline.validate(actions, durationS, Double.NaN);
            List<CheckDef> checks = new ArrayList<>();
            Set<String> names = new HashSet<>();
            for (Node n : top.list("checks")) {
                CheckDef c = check(YamlObject.of(label, n, "a check"));
                if (!names.add(c.name())) {
                    throw new SequenceException(c.mark(), "check name '" + c.name() + "' is used twice");
                }
                checks.add(c);
            }
            if (checks.isEmpty()) {
                throw new SequenceException(top.mark(), "a sequence needs at least one check under 'checks'");
            }
            return new Sequence(name, purpose, label, baseDir, turbine, controller, initial, stepUs, exchangeEvery,
                    watchdogUs, durationS, List.copyOf(trips), List.copyOf(actions), List.copyOf(checks));
        }

        private String tripName(Node n) {
            String s = n instanceof org.yaml.snakeyaml.nodes.ScalarNode
                    ? ((org.yaml.snakeyaml.nodes.ScalarNode) n).getValue() : "";
            if (!Sequence.TRIP_NAMES.contains(s)) {
                throw new SequenceException(YamlObject.mark(label, n), "unknown trip '" + s + "' in allow_trips; valid: "
                        + String.join(", ", Sequence.TRIP_NAMES));
            }
            return s;
        }

        private Sequence.Initial initial(YamlObject o) {
            o.allowOnly("wind_m_s", "grid_voltage_pu", "reactive_power_pu");
            return new Sequence.Initial(o.number("wind_m_s", 0, 40, "m/s"),
                    o.number("grid_voltage_pu", 1.0, 0.8, 1.2, "pu"),
                    o.number("reactive_power_pu", 0.0, -1.0, 1.0, "pu"));
        }

        /** An action item: {@code at_s} plus exactly one action key. */
        private Action action(YamlObject item) {
            String kind = onlyKind(item, "at_s", ACTION_KINDS, "action");
            double at = item.number("at_s", 0, durationS, "s");
            SourceMark m = item.mark();
            YamlObject p = item.object(kind);
            switch (kind) {
                case "wind_step":
                    p.allowOnly("to_m_s");
                    return new Action.WindStep(at, m, p.number("to_m_s", 0, 40, "m/s"));
                case "wind_ramp":
                    p.allowOnly("to_m_s", "duration_s");
                    return new Action.WindRamp(at, m, p.number("to_m_s", 0, 40, "m/s"), p.positive("duration_s", "s"));
                case "wind_gust":
                    p.allowOnly("amplitude_m_s", "duration_s");
                    return new Action.WindGust(at, m, p.number("amplitude_m_s", 0, 20, "m/s"),
                            p.has("duration_s") ? p.positive("duration_s", "s") : 10.5);
                case "turbulence": {
                    p.allowOnly("duration_s", "sigma_m_s", "intensity", "length_scale_m", "max_frequency_hz", "seed");
                    if (p.has("sigma_m_s") == p.has("intensity")) {
                        throw new SequenceException(p.mark(), "turbulence needs exactly one of 'sigma_m_s' or 'intensity'");
                    }
                    return new Action.Turbulence(at, m, p.positive("duration_s", "s"),
                            p.number("sigma_m_s", Double.NaN, 0, 10, "m/s"), p.number("intensity", Double.NaN, 0, 0.5, ""),
                            p.number("length_scale_m", 340.2, 1, 5000, "m"),
                            p.number("max_frequency_hz", 2.0, 0.05, 20, "Hz"),
                            p.integer("seed", 1, Long.MIN_VALUE / 2, Long.MAX_VALUE / 2));
                }
                case "grid_dip":
                case "grid_swell": {
                    boolean dip = kind.equals("grid_dip");
                    String key = dip ? "depth_pu" : "rise_pu";
                    p.allowOnly(key, "duration_s", "recovery_s");
                    double[] d = p.numbers(key, 3);
                    for (int i = 0; i < 3; i++) {
                        if (d[i] < 0 || d[i] > (dip ? 1.0 : 0.5)) {
                            throw new SequenceException(p.markOf(key), key + " of phase " + "abc".charAt(i) + " is "
                                    + YamlObject.fmt(d[i]) + " pu, must be within 0 .. " + (dip ? "1" : "0.5") + " pu");
                        }
                        d[i] = dip ? -d[i] : d[i];
                    }
                    return new Action.GridVoltageEvent(at, m, kind, d, p.positive("duration_s", "s"),
                            p.number("recovery_s", 0, 0, 600, "s"));
                }
                case "phase_jump":
                    p.allowOnly("angle_deg");
                    return new Action.PhaseJump(at, m, p.number("angle_deg", -180, 180, "deg"));
                case "frequency_step":
                    p.allowOnly("to_hz");
                    return new Action.FrequencyStep(at, m, p.number("to_hz", 40, 70, "Hz"));
                case "frequency_ramp": {
                    p.allowOnly("to_hz", "rate_hz_s");
                    double to = p.number("to_hz", 40, 70, "Hz");
                    double rate = p.positive("rate_hz_s", "Hz/s");
                    return new Action.FrequencyRamp(at, m, to, rate, Double.NaN);
                }
                case "grid_strength":
                    p.allowOnly("short_circuit_ratio", "x_over_r");
                    return new Action.GridStrength(at, m, p.number("short_circuit_ratio", 1.0, 1000, ""),
                            p.number("x_over_r", 0.1, 100, ""));
                case "voltage_ref_step":
                    p.allowOnly("deviation_pu");
                    return new Action.VoltageRefStep(at, m, p.number("deviation_pu", -0.3, 0.3, "pu"));
                default: {
                    p.allowOnly("kind", "duration_s", "rate", "delay_exchanges");
                    String k = p.text("kind");
                    LinkFaultKind lk;
                    switch (k) {
                        case "drop": lk = LinkFaultKind.DROP; break;
                        case "delay": lk = LinkFaultKind.DELAY; break;
                        case "duplicate": lk = LinkFaultKind.DUPLICATE; break;
                        case "corrupt": lk = LinkFaultKind.CORRUPT; break;
                        case "silence": lk = LinkFaultKind.SILENCE; break;
                        default:
                            throw new SequenceException(p.markOf("kind"), "unknown link fault kind '" + k
                                    + "'; valid: drop, delay, duplicate, corrupt, silence");
                    }
                    if (lk == LinkFaultKind.SILENCE && p.has("rate")) {
                        throw new SequenceException(p.markOf("rate"), "silence drops every reply; it takes no 'rate'");
                    }
                    double rate = lk == LinkFaultKind.SILENCE ? 1.0 : p.number("rate", 1.0, 0.0, 1.0, "");
                    int delay = (int) p.integer("delay_exchanges", 1, 1, 1000);
                    if (lk != LinkFaultKind.DELAY && p.has("delay_exchanges")) {
                        throw new SequenceException(p.markOf("delay_exchanges"), "delay_exchanges applies to kind: delay only");
                    }
                    return new Action.LinkFault(at, m, lk, p.positive("duration_s", "s"), rate, delay);
                }
            }
        }

        /** The one key of {@code item} besides {@code fixed} (and {@code name}), which must be a known kind. */
        private String onlyKind(YamlObject item, String fixed, String[] kinds, String what) {
            String kind = null;
            for (String k : item.keys()) {
                if (k.equals(fixed)) {
                    continue;
                }
                if (!List.of(kinds).contains(k)) {
                    throw new SequenceException(item.mark(), "unknown " + what + " '" + k + "'; valid: "
                            + String.join(", ", kinds));
                }
                if (kind != null) {
                    throw new SequenceException(item.mark(), "one " + what + " per list item, found '" + kind + "' and '"
                            + k + "'");
                }
                kind = k;
            }
            if (kind == null) {
                throw new SequenceException(item.mark(), "the " + what + " needs one of: " + String.join(", ", kinds));
            }
            return kind;
        }

        private double window(YamlObject p, String key, double otherwise) {
            return p.number(key, otherwise, 0, durationS, "s");
        }

        private void order(YamlObject p, String a, double av, String b, double bv) {
            if (!(av < bv)) {
                throw new SequenceException(p.markOf(b), "'" + b + "' (" + YamlObject.fmt(bv) + " s) must be after '"
                        + a + "' (" + YamlObject.fmt(av) + " s)");
            }
        }

        /** A check item: {@code name} plus exactly one check key. */
        private CheckDef check(YamlObject item) {
            String kind = onlyKind(item, "name", CHECK_KINDS, "check");
            String name = item.text("name");
            if (!NAME.matcher(name).matches()) {
                throw new SequenceException(item.markOf("name"), "check name '" + name + "' must be lower case letters, "
                        + "digits and dashes");
            }
            YamlObject p = item.object(kind);
            Map<String, SourceMark> sig = new LinkedHashMap<>();
            SourceMark m = item.mark();
            switch (kind) {
                case "band": {
                    p.allowOnly("signal", "low", "high", "from_s", "to_s");
                    String s = signal(p, "signal", null, sig);
                    double lo = p.number("low", Double.NaN), hi = p.number("high", Double.NaN);
                    if (Double.isNaN(lo) && Double.isNaN(hi)) {
                        throw new SequenceException(p.mark(), "band needs 'low', 'high' or both");
                    }
                    if (lo > hi) {
                        throw new SequenceException(p.markOf("high"), "'high' must not be below 'low'");
                    }
                    double from = window(p, "from_s", 0), to = window(p, "to_s", durationS);
                    order(p, "from_s", from, "to_s", to);
                    return new CheckDef(name, kind, m, sig, () -> new BandCheck(name, s, lo, hi, from, to));
                }
                case "settle": {
                    p.allowOnly("signal", "target", "tolerance", "after_s", "by_s", "to_s", "pre_s");
                    String s = signal(p, "signal", null, sig);
                    double target = p.text("target").equals("pre") ? Double.NaN : p.number("target");
                    double tol = p.positive("tolerance", "");
                    double pre = p.number("pre_s", 0.1, 0.001, 10, "s");
                    double after = window(p, "after_s", 0), by = p.number("by_s", 0, durationS, "s");
                    double to = window(p, "to_s", durationS);
                    order(p, "after_s", after, "by_s", by);
                    if (by > to) {
                        throw new SequenceException(p.markOf("by_s"), "'by_s' must not be after 'to_s'");
                    }
                    if (Double.isNaN(target) && after - pre < 0) {
                        throw new SequenceException(p.markOf("target"), "target: pre needs " + YamlObject.fmt(pre)
                                + " s of signal before after_s");
                    }
                    return new CheckDef(name, kind, m, sig, () -> new SettleCheck(name, s, target, tol, after, by, to, pre));
                }
                case "rise_time":
                case "overshoot": {
                    boolean rise = kind.equals("rise_time");
                    p.allowOnly("signal", "at_s", "initial", "final", rise ? "max_s" : "max_percent", "to_s");
                    String s = signal(p, "signal", null, sig);
                    double at = window(p, "at_s", 0), ini = p.number("initial", Double.NaN), fin = p.number("final");
                    double to = window(p, "to_s", durationS);
                    order(p, "at_s", at, "to_s", to);
                    if (ini == fin) {
                        throw new SequenceException(p.markOf("final"), "'final' equals 'initial': there is no step to judge");
                    }
                    if (rise) {
                        double max = p.positive("max_s", "s");
                        return new CheckDef(name, kind, m, sig, () -> new RiseTimeCheck(name, s, at, ini, fin, max, to));
                    }
                    double max = p.number("max_percent", 0, 1000, "%");
                    return new CheckDef(name, kind, m, sig, () -> new OvershootCheck(name, s, at, ini, fin, max, to));
                }
                case "event_after": {
                    p.allowOnly("trigger", "response", "within_s");
                    YamlObject t = p.object("trigger");
                    double within = p.positive("within_s", "s");
                    Condition response = condition(p.object("response"), sig, false);
                    if (t.has("at_s")) {
                        t.allowOnly("at_s");
                        double at = window(t, "at_s", 0);
                        return new CheckDef(name, kind, m, sig, () -> new EventAfterCheck(name, null, at,
                                fresh(response), within));
                    }
                    Condition trig = condition(t, sig, true);
                    double from = window(t, "from_s", 0);
                    return new CheckDef(name, kind, m, sig, () -> new EventAfterCheck(name, fresh(trig), from,
                            fresh(response), within));
                }
                case "envelope": {
                    p.allowOnly("signal", "at_s", "points", "require_gating");
                    String s = signal(p, "signal", "v_poc_pu", sig);
                    sig.put("trip_flags", p.mark());
                    sig.put("status_flags", p.mark());
                    double at = window(p, "at_s", 0);
                    List<Node> pts = p.list("points");
                    if (pts.size() < 2) {
                        throw new SequenceException(p.markOf("points"), "an envelope needs at least two points [t_s, v_pu]");
                    }
                    double[] ts = new double[pts.size()], vs = new double[pts.size()];
                    for (int i = 0; i < pts.size(); i++) {
                        Node n = pts.get(i);
                        if (!(n instanceof SequenceNode) || ((SequenceNode) n).getValue().size() != 2) {
                            throw new SequenceException(YamlObject.mark(label, n), "envelope point " + (i + 1)
                                    + " must be [t_s, v_pu]");
                        }
                        ts[i] = YamlObject.toNumber(label, ((SequenceNode) n).getValue().get(0), "point time");
                        vs[i] = YamlObject.toNumber(label, ((SequenceNode) n).getValue().get(1), "point voltage");
                        if (ts[i] < 0 || (i > 0 && ts[i] < ts[i - 1])) {
                            throw new SequenceException(YamlObject.mark(label, n), "envelope point times must start at 0 "
                                    + "or later and never decrease");
                        }
                        if (vs[i] < 0 || vs[i] > 2) {
                            throw new SequenceException(YamlObject.mark(label, n), "envelope voltage must be within 0 .. 2 pu");
                        }
                    }
                    if (at + ts[ts.length - 1] > durationS) {
                        throw new SequenceException(p.markOf("points"), "the profile ends at " + YamlObject.fmt(at
                                + ts[ts.length - 1]) + " s, after the end of the run (" + YamlObject.fmt(durationS) + " s)");
                    }
                    boolean gating = p.flag("require_gating", true);
                    return new CheckDef(name, kind, m, sig, () -> new EnvelopeCheck(name, s, at, ts, vs, gating));
                }
                case "reactive_current": {
                    p.allowOnly("at_s", "until_s", "k", "delay_s", "tolerance_pu", "tolerance_low_pu", "tolerance_high_pu",
                            "deadband_pu", "max_pu", "pre_s", "voltage_signal", "current_signal", "rated_current_pu");
                    String v = signal(p, "voltage_signal", "v_term_pu", sig);
                    String i = signal(p, "current_signal", "i_reactive_pu", sig);
                    double at = window(p, "at_s", 0), until = window(p, "until_s", durationS);
                    double k = p.number("k", 0, 20, ""), delay = p.number("delay_s", 0, 10, "s");
                    order(p, "at_s + delay_s", at + delay, "until_s", until);
                    double tlo, thi;
                    if (p.has("tolerance_pu")) {
                        if (p.has("tolerance_low_pu") || p.has("tolerance_high_pu")) {
                            throw new SequenceException(p.markOf("tolerance_pu"), "give either 'tolerance_pu' or "
                                    + "'tolerance_low_pu' and 'tolerance_high_pu'");
                        }
                        tlo = thi = p.positive("tolerance_pu", "pu");
                    } else {
                        tlo = p.positive("tolerance_low_pu", "pu");
                        thi = p.positive("tolerance_high_pu", "pu");
                    }
                    double db = p.number("deadband_pu", 0, 0, 0.5, "pu"), max = p.number("max_pu", 1.0, 0.1, 2, "pu");
                    double pre = p.number("pre_s", 0.1, 0.001, 10, "s");
                    double in = p.number("rated_current_pu", 1.0, 0.1, 10, "pu");
                    if (at - pre < 0) {
                        throw new SequenceException(p.markOf("at_s"), "the pre-fault window of " + YamlObject.fmt(pre)
                                + " s before at_s starts before the run");
                    }
                    return new CheckDef(name, kind, m, sig, () -> new ReactiveCurrentCheck(name, v, i, at, until, k,
                            delay, tlo, thi, db, max, pre, in));
                }
                case "power_recovery": {
                    p.allowOnly("signal", "fault_at_s", "cleared_at_s", "within_s", "fraction", "pre_s");
                    String s = signal(p, "signal", "p_grid_pu", sig);
                    double fault = window(p, "fault_at_s", 0), cleared = window(p, "cleared_at_s", 0);
                    order(p, "fault_at_s", fault, "cleared_at_s", cleared);
                    double within = p.positive("within_s", "s"), frac = p.number("fraction", 0.9, 0.01, 1.0, "");
                    double pre = p.number("pre_s", 0.1, 0.001, 10, "s");
                    if (fault - pre < 0) {
                        throw new SequenceException(p.markOf("fault_at_s"), "the pre-fault window of " + YamlObject.fmt(pre)
                                + " s starts before the run");
                    }
                    return new CheckDef(name, kind, m, sig, () -> new PowerRecoveryCheck(name, s, fault, cleared, within,
                            frac, pre));
                }
                case "flags": {
                    p.allowOnly("signal", "never_set", "from_s", "to_s");
                    String s = signal(p, "signal", "trip_flags", sig);
                    long mask = p.integer("never_set", 0, 1, Integer.MAX_VALUE);
                    if (mask == 0) {
                        throw new SequenceException(p.mark(), "flags needs 'never_set' (a bit mask, decimal)");
                    }
                    double from = window(p, "from_s", 0), to = window(p, "to_s", durationS);
                    order(p, "from_s", from, "to_s", to);
                    return new CheckDef(name, kind, m, sig, () -> new FlagsCheck(name, s, mask, from, to));
                }
                case "timing": {
                    p.allowOnly("lateness_p99_us", "lateness_p999_us", "round_trip_p99_us", "overruns_max");
                    double l99 = p.number("lateness_p99_us", Double.NaN), l999 = p.number("lateness_p999_us", Double.NaN);
                    double rt = p.number("round_trip_p99_us", Double.NaN);
                    long ov = p.integer("overruns_max", 0, 0, Long.MAX_VALUE / 2);
                    return new CheckDef(name, kind, m, sig, () -> new TimingCheck(name, l99, l999, rt, ov));
                }
                default: {
                    p.allowOnly("missing_replies_max", "rejected_max", "late_replies_max", "watchdog_trips",
                            "reply_age_max");
                    long miss = p.integer("missing_replies_max", -1, 0, Long.MAX_VALUE / 2);
                    long rej = p.integer("rejected_max", -1, 0, Long.MAX_VALUE / 2);
                    long late = p.integer("late_replies_max", -1, 0, Long.MAX_VALUE / 2);
                    long wd = p.integer("watchdog_trips", -1, 0, 1000);
                    double age = p.number("reply_age_max", Double.NaN);
                    if (!Double.isNaN(age)) {
                        sig.put("reply_age", p.markOf("reply_age_max"));
                    }
                    return new CheckDef(name, kind, m, sig, () -> new LinkHealthCheck(name, miss, rej, late, wd, age));
                }
            }
        }

        private String signal(YamlObject p, String key, String otherwise, Map<String, SourceMark> sig) {
            String s = otherwise == null ? p.text(key) : p.text(key, otherwise);
            sig.putIfAbsent(s, p.markOf(key));
            return s;
        }

        /** {@code {signal: x, above|below|bits_set|bits_clear: v}} (plus {@code from_s} for a trigger). */
        private Condition condition(YamlObject c, Map<String, SourceMark> sig, boolean trigger) {
            if (trigger) {
                c.allowOnly("signal", "above", "below", "bits_set", "bits_clear", "from_s");
            } else {
                c.allowOnly("signal", "above", "below", "bits_set", "bits_clear");
            }
            String s = signal(c, "signal", null, sig);
            Condition.Kind kind = null;
            double v = 0;
            String[] keys = {"above", "below", "bits_set", "bits_clear"};
            Condition.Kind[] kinds = Condition.Kind.values();
            for (int i = 0; i < keys.length; i++) {
                if (c.has(keys[i])) {
                    if (kind != null) {
                        throw new SequenceException(c.mark(), "a condition takes one of above, below, bits_set, bits_clear");
                    }
                    kind = kinds[i];
                    v = i < 2 ? c.number(keys[i]) : c.integer(keys[i], 0, 1, Integer.MAX_VALUE);
                }
            }
            if (kind == null) {
                throw new SequenceException(c.mark(), "a condition needs one of above, below, bits_set, bits_clear");
            }
            return new Condition(s, kind, v);
        }

        private static Condition fresh(Condition c) {
            return c.copy();
        }
    }
}
