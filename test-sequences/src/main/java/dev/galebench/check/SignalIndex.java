package dev.galebench.check;

import java.util.Arrays;

/**
 * The signal layout of one run (names and units of every slot of a sample), as checks look
 * signals up in it. A name that is not in the layout is refused with the full list of valid
 * names, so a typo in a sequence file is answered with the right spelling.
 */
public final class SignalIndex {
    private final String[] names;
    private final String[] units;

    public SignalIndex(String[] names, String[] units) {
        if (names.length != units.length) {
            throw new IllegalArgumentException("signal names and units differ in length");
        }
        this.names = names.clone();
        this.units = units.clone();
    }

    /** Slot of {@code name}. @throws IllegalArgumentException naming the valid signals */
    public int of(String name) {
        for (int i = 0; i < names.length; i++) {
            if (names[i].equals(name)) {
                return i;
            }
        }
        throw new IllegalArgumentException("unknown signal '" + name + "'; valid signals: " + String.join(", ", names));
    }

    public boolean contains(String name) {
        return Arrays.asList(names).contains(name);
    }

    public String unit(int index) {
        return units[index];
    }

    public String name(int index) {
        return names[index];
    }

    public int size() {
        return names.length;
    }

    /** A copy of the names. */
    public String[] names() {
        return names.clone();
    }
}
