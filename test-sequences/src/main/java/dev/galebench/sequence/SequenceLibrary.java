package dev.galebench.sequence;

import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

/**
 * The shipped acceptance sequences, packaged as classpath resources under
 * {@code galebench/library/} (sources in {@code test-sequences/library/}), listed in
 * {@code index.txt} in the order the {@code sequences} command prints them.
 */
public final class SequenceLibrary {
    /** Classpath folder of the library. */
    public static final String RESOURCE_DIR = "galebench/library/";

    private SequenceLibrary() {
    }

    /** Names in the library, in index order. */
    public static List<String> names() {
        String idx = read(RESOURCE_DIR + "index.txt");
        List<String> out = new ArrayList<>();
        for (String line : idx.split("\n")) {
            String s = line.trim();
            if (!s.isEmpty() && !s.startsWith("#")) {
                out.add(s);
            }
        }
        return out;
    }

    /** The library file of {@code name}, as a label for messages and listings. */
    public static String fileOf(String name) {
        return "library/" + name + ".yaml";
    }

    /** Parses library sequence {@code name}. */
    public static Sequence load(String name) {
        if (!names().contains(name)) {
            throw new IllegalArgumentException("no sequence '" + name + "' in the library; library sequences: "
                    + String.join(", ", names()));
        }
        return SequenceParser.parse(fileOf(name), read(RESOURCE_DIR + name + ".yaml"), null);
    }

    /** The YAML text of library sequence {@code name}. */
    public static String text(String name) {
        return read(RESOURCE_DIR + name + ".yaml");
    }

    /**
     * Resolves what a user typed: an existing file path, else a library name.
     *
     * @throws IllegalArgumentException if it is neither, listing the library names
     */
    public static Sequence resolve(String fileOrName) {
        Path p = Path.of(fileOrName);
        if (Files.isRegularFile(p)) {
            return SequenceParser.parseFile(p);
        }
        if (names().contains(fileOrName)) {
            return load(fileOrName);
        }
        throw new IllegalArgumentException("'" + fileOrName + "' is neither a file nor a library sequence; library "
                + "sequences: " + String.join(", ", names()));
    }

    private static String read(String resource) {
        try (InputStream in = SequenceLibrary.class.getClassLoader().getResourceAsStream(resource)) {
            if (in == null) {
                throw new IllegalStateException("missing resource " + resource + " (broken build?)");
            }
            return new String(in.readAllBytes(), StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}
