package dev.galebench.sequence;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.yaml.snakeyaml.nodes.MappingNode;
import org.yaml.snakeyaml.nodes.Node;
import org.yaml.snakeyaml.nodes.NodeTuple;
import org.yaml.snakeyaml.nodes.ScalarNode;
import org.yaml.snakeyaml.nodes.SequenceNode;

/**
 * A YAML mapping read through SnakeYAML's node API, so that every value keeps its position
 * in the file. Each accessor turns a wrong type, a missing key or an out-of-range number into a
 * {@link SequenceException} that names the file, line, column, key and what was expected.
 * Unknown keys are refused (with the list of valid ones): a typo must never silently drop a
 * parameter. Parse-time only; not for the real-time thread.
 */
final class YamlObject {
    private final String file;
    private final Node node;
    private final String context;
    private final Map<String, NodeTuple> entries = new LinkedHashMap<>();

    private YamlObject(String file, Node node, String context) {
        this.file = file;
        this.node = node;
        this.context = context;
    }

    /** Wraps {@code node}, which must be a mapping with unique string keys. */
    static YamlObject of(String file, Node node, String context) {
        if (!(node instanceof MappingNode)) {
            throw new SequenceException(mark(file, node), context + " must be a mapping of keys to values, found "
                    + describe(node));
        }
        YamlObject o = new YamlObject(file, node, context);
        for (NodeTuple t : ((MappingNode) node).getValue()) {
            Node k = t.getKeyNode();
            if (!(k instanceof ScalarNode)) {
                throw new SequenceException(mark(file, k), "keys in " + context + " must be plain words");
            }
            String key = ((ScalarNode) k).getValue();
            if (o.entries.containsKey(key)) {
                throw new SequenceException(mark(file, k), "key '" + key + "' appears twice in " + context);
            }
            o.entries.put(key, t);
        }
        return o;
    }

    static SourceMark mark(String file, Node node) {
        return new SourceMark(file, node.getStartMark().getLine() + 1, node.getStartMark().getColumn() + 1);
    }

    static String describe(Node n) {
        if (n instanceof ScalarNode) {
            return "'" + ((ScalarNode) n).getValue() + "'";
        }
        return n instanceof SequenceNode ? "a list" : "a mapping";
    }

    String file() {
        return file;
    }

    String context() {
        return context;
    }

    SourceMark mark() {
        return mark(file, node);
    }

    /** Position of the value of {@code key} (or of the mapping if absent). */
    SourceMark markOf(String key) {
        NodeTuple t = entries.get(key);
        return t == null ? mark() : mark(file, t.getValueNode());
    }

    List<String> keys() {
        return new ArrayList<>(entries.keySet());
    }

    boolean has(String key) {
        return entries.containsKey(key);
    }

    /** Refuses any key not in {@code allowed}, listing the allowed ones. */
    void allowOnly(String... allowed) {
        List<String> ok = Arrays.asList(allowed);
        for (Map.Entry<String, NodeTuple> e : entries.entrySet()) {
            if (!ok.contains(e.getKey())) {
                throw new SequenceException(mark(file, e.getValue().getKeyNode()), "unknown key '" + e.getKey()
                        + "' in " + context + "; valid keys: " + String.join(", ", allowed));
            }
        }
    }

    /** Refuses the mapping if a required key is missing. */
    Node node(String key) {
        NodeTuple t = entries.get(key);
        if (t == null) {
            throw new SequenceException(mark(), context + " needs key '" + key + "'");
        }
        return t.getValueNode();
    }

    String text(String key) {
        Node n = node(key);
        if (!(n instanceof ScalarNode)) {
            throw new SequenceException(mark(file, n), "'" + key + "' in " + context + " must be a text, found "
                    + describe(n));
        }
        return ((ScalarNode) n).getValue();
    }

    String text(String key, String otherwise) {
        return has(key) ? text(key) : otherwise;
    }

    double number(String key) {
        return toNumber(file, node(key), "'" + key + "' in " + context);
    }

    double number(String key, double otherwise) {
        return has(key) ? number(key) : otherwise;
    }

    /** A number in {@code [min, max]}; the unit goes into the message. */
    double number(String key, double min, double max, String unit) {
        double v = number(key);
        if (v < min || v > max) {
            throw new SequenceException(markOf(key), "'" + key + "' in " + context + " is " + fmt(v) + " " + unit
                    + ", must be within " + fmt(min) + " .. " + fmt(max) + " " + unit);
        }
        return v;
    }

    double number(String key, double otherwise, double min, double max, String unit) {
        return has(key) ? number(key, min, max, unit) : otherwise;
    }

    /** A strictly positive number. */
    double positive(String key, String unit) {
        double v = number(key);
        if (!(v > 0)) {
            throw new SequenceException(markOf(key), "'" + key + "' in " + context + " is " + fmt(v) + " " + unit
                    + ", must be greater than 0");
        }
        return v;
    }

    long integer(String key, long otherwise, long min, long max) {
        if (!has(key)) {
            return otherwise;
        }
        double v = number(key);
        if (v != Math.rint(v) || v < min || v > max) {
            throw new SequenceException(markOf(key), "'" + key + "' in " + context + " is " + fmt(v)
                    + ", must be a whole number within " + min + " .. " + max);
        }
        return (long) v;
    }

    boolean flag(String key, boolean otherwise) {
        if (!has(key)) {
            return otherwise;
        }
        String s = text(key);
        if (s.equals("true")) {
            return true;
        }
        if (s.equals("false")) {
            return false;
        }
        throw new SequenceException(markOf(key), "'" + key + "' in " + context + " must be true or false, found '"
                + s + "'");
    }

    /** A number or a list of exactly {@code n} numbers (one per phase); a number is repeated. */
    double[] numbers(String key, int n) {
        Node v = node(key);
        double[] out = new double[n];
        if (v instanceof ScalarNode) {
            Arrays.fill(out, toNumber(file, v, "'" + key + "' in " + context));
            return out;
        }
        if (!(v instanceof SequenceNode) || ((SequenceNode) v).getValue().size() != n) {
            throw new SequenceException(mark(file, v), "'" + key + "' in " + context + " must be a number or a list of "
                    + n + " numbers");
        }
        List<Node> items = ((SequenceNode) v).getValue();
        for (int i = 0; i < n; i++) {
            out[i] = toNumber(file, items.get(i), "item " + (i + 1) + " of '" + key + "' in " + context);
        }
        return out;
    }

    /** A list (absent = empty). */
    List<Node> list(String key) {
        if (!has(key)) {
            return List.of();
        }
        Node v = node(key);
        if (v instanceof ScalarNode && v.getTag().equals(org.yaml.snakeyaml.nodes.Tag.NULL)) {
            return List.of();
        }
        if (!(v instanceof SequenceNode)) {
            throw new SequenceException(mark(file, v), "'" + key + "' in " + context + " must be a list, found "
                    + describe(v));
        }
        return ((SequenceNode) v).getValue();
    }

    YamlObject object(String key) {
        return of(file, node(key), "'" + key + "' in " + context);
    }

    static double toNumber(String file, Node n, String what) {
        if (!(n instanceof ScalarNode)) {
            throw new SequenceException(mark(file, n), what + " must be a number, found " + describe(n));
        }
        String s = ((ScalarNode) n).getValue().trim();
        double v;
        try {
            v = Double.parseDouble(s.replace("_", ""));
        } catch (NumberFormatException e) {
            throw new SequenceException(mark(file, n), what + " must be a number, found '" + s + "'");
        }
        if (!Double.isFinite(v) || s.isEmpty() || Character.isLetter(s.charAt(s.length() - 1))) {
            throw new SequenceException(mark(file, n), what + " must be a finite number, found '" + s + "'");
        }
        return v;
    }

    /** Short number form for messages: no trailing zeros. */
    static String fmt(double v) {
        if (v == Math.rint(v) && Math.abs(v) < 1e15) {
            return Long.toString((long) v);
        }
        String s = String.format(java.util.Locale.ROOT, "%.6g", v);
        if (s.contains("e") || s.contains("E")) {
            return s;
        }
        return s.contains(".") ? s.replaceAll("0+$", "").replaceAll("\\.$", "") : s;
    }
}
