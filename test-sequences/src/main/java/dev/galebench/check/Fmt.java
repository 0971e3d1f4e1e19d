package dev.galebench.check;

import java.util.Locale;

/** Human-readable numbers with units for verdict texts (4 significant digits, no trailing zeros). */
public final class Fmt {
    private Fmt() {
    }

    /** {@code 0.8123 pu}, {@code 1234 V}, {@code 12.5 %}; unit "1" is left out. */
    public static String value(double v, String unit) {
        String n = number(v);
        return unit == null || unit.isEmpty() || unit.equals("1") ? n : n + " " + unit;
    }

    /** Durations: below one second in ms ({@code 12.4 ms}), else in s ({@code 1.234 s}). */
    public static String duration(double seconds) {
        if (Math.abs(seconds) < 1.0) {
            return number(seconds * 1e3) + " ms";
        }
        return number(seconds) + " s";
    }

    /** A point in plant time, always in s with ms resolution ({@code 1.043 s}). */
    public static String time(double seconds) {
        return String.format(Locale.ROOT, "%.4f s", seconds).replaceAll("0+ s$", " s").replaceAll("\\. s$", ".0 s");
    }

    public static String number(double v) {
        if (Double.isNaN(v)) {
            return "n/a";
        }
        if (v == 0) {
            return "0";
        }
        double a = Math.abs(v);
        String s;
        if (a >= 1e6 || a < 1e-3) {
            s = String.format(Locale.ROOT, "%.3e", v);
            return s;
        }
        int digits = Math.max(0, 3 - (int) Math.floor(Math.log10(a)));
        s = String.format(Locale.ROOT, "%." + digits + "f", v);
        if (s.contains(".")) {
            s = s.replaceAll("0+$", "").replaceAll("\\.$", "");
        }
        return s;
    }
}
