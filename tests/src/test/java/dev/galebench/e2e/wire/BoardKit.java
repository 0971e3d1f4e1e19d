package dev.galebench.e2e.wire;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStreamReader;
import java.io.OutputStreamWriter;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.Paths;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.TimeUnit;

/**
 * Builds the C board kit ({@code io-bridge/board-kit}) with gcc and the strict flags a
 * firmware build would use, once per test JVM, and runs its programs.
 */
final class BoardKit {
    static final String[] FLAGS = {"-std=c99", "-Wall", "-Wextra", "-Werror", "-pedantic", "-Wconversion", "-Wshadow", "-O2"};
    private static Path built;
    private static String compilerOutput = "";

    private BoardKit() {
    }

    /** The kit's source directory, found from the tests module's working directory. */
    static Path sourceDir() {
        for (Path p : new Path[] {Paths.get("..", "io-bridge", "board-kit"), Paths.get("io-bridge", "board-kit")}) {
            if (Files.isRegularFile(p.resolve("include/gb_wire.h"))) {
                return p.toAbsolutePath().normalize();
            }
        }
        throw new IllegalStateException("io-bridge/board-kit not found from " + Paths.get("").toAbsolutePath());
    }

    /** Compiles the three programs into target/board-kit (once); returns that directory. */
    static synchronized Path build() throws IOException, InterruptedException {
        if (built != null) {
            return built;
        }
        final Path src = sourceDir();
        final Path out = Paths.get("target", "board-kit").toAbsolutePath();
        Files.createDirectories(out);
        final StringBuilder diagnostics = new StringBuilder();
        compile(src, out.resolve("gb_vectors"), "tools/gb_vectors.c", diagnostics);
        compile(src, out.resolve("udp_board"), "examples/udp_board.c", diagnostics);
        compile(src, out.resolve("udp_pingpong"), "tools/udp_pingpong.c", diagnostics);
        compilerOutput = diagnostics.toString();
        built = out;
        return out;
    }

    /** Everything gcc printed while building (empty when the code is warning-free). */
    static String compilerOutput() {
        return compilerOutput;
    }

    private static void compile(Path src, Path binary, String main, StringBuilder diagnostics) throws IOException, InterruptedException {
        final List<String> cmd = new ArrayList<>();
        cmd.add("gcc");
        cmd.addAll(List.of(FLAGS));
        cmd.add("-I" + src.resolve("include"));
        cmd.add("-o");
        cmd.add(binary.toString());
        cmd.add(src.resolve(main).toString());
        cmd.add(src.resolve("src/gb_wire.c").toString());
        cmd.add("-lm");
        final Process p = new ProcessBuilder(cmd).redirectErrorStream(true).start();
        final String output = new String(p.getInputStream().readAllBytes(), StandardCharsets.UTF_8);
        if (!p.waitFor(120, TimeUnit.SECONDS) || p.exitValue() != 0) {
            throw new IllegalStateException("gcc failed for " + main + ":\n" + output);
        }
        diagnostics.append(output);
    }

    /** Runs {@code program args} with {@code input} on stdin; returns stdout lines; fails on non-zero exit. */
    static List<String> run(String program, List<String> input, String... args) throws IOException, InterruptedException {
        final List<String> cmd = new ArrayList<>();
        cmd.add(build().resolve(program).toString());
        cmd.addAll(List.of(args));
        final Process p = new ProcessBuilder(cmd).redirectError(ProcessBuilder.Redirect.INHERIT).start();
        final List<String> lines = new ArrayList<>();
        final Thread reader = new Thread(() -> {
            try (BufferedReader r = new BufferedReader(new InputStreamReader(p.getInputStream(), StandardCharsets.UTF_8))) {
                String line;
                while ((line = r.readLine()) != null) {
                    synchronized (lines) {
                        lines.add(line);
                    }
                }
            } catch (IOException ignored) {
                // process ended
            }
        });
        reader.start();
        try (Writer w = new OutputStreamWriter(p.getOutputStream(), StandardCharsets.US_ASCII)) {
            for (String line : input) {
                w.write(line);
                w.write('\n');
            }
        }
        if (!p.waitFor(120, TimeUnit.SECONDS)) {
            p.destroy();
            throw new IllegalStateException(program + " did not finish");
        }
        reader.join(10_000);
        if (p.exitValue() != 0) {
            throw new IllegalStateException(program + " exited with " + p.exitValue());
        }
        synchronized (lines) {
            return new ArrayList<>(lines);
        }
    }

    static String hex(byte[] b, int length) {
        final StringBuilder s = new StringBuilder(length * 2);
        for (int i = 0; i < length; i++) {
            s.append(Character.forDigit((b[i] >> 4) & 0xF, 16)).append(Character.forDigit(b[i] & 0xF, 16));
        }
        return s.toString();
    }

    static byte[] unhex(String s) {
        final byte[] b = new byte[s.length() / 2];
        for (int i = 0; i < b.length; i++) {
            b[i] = (byte) Integer.parseInt(s.substring(2 * i, 2 * i + 2), 16);
        }
        return b;
    }
}
