package dev.galebench.runner;

import dev.galebench.rt.Sample;
import dev.galebench.rt.SampleConsumer;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;

/**
 * A fingerprint of a run's waveforms, exact to the bit: a 64-bit FNV-1a hash over the raw
 * IEEE-754 bits of every sample of every signal (per signal, and per block of one second of
 * plant time over all signals). Wall-clock signals ({@code lateness_us}, {@code compute_us},
 * {@code rtt_us}) are left out: they differ between any two runs. Written as
 * {@code waveform-digest.txt} in the run folder; {@code galebench replay} recomputes it from
 * an offline re-run and names the first block and the signals that differ.
 *
 * <p>Costs one multiply and one xor per byte of sample data on the consumer's thread; keeps no
 * samples (flat memory), allocates nothing per sample.
 */
public final class WaveformDigest implements SampleConsumer {
    /** File name inside a run folder. */
    public static final String FILE_NAME = "waveform-digest.txt";
    static final Set<String> WALL_CLOCK = Set.of("lateness_us", "compute_us", "rtt_us");
    private static final long FNV_OFFSET = 0xcbf29ce484222325L;
    private static final long FNV_PRIME = 0x100000001b3L;
    private static final long BLOCK_NS = 1_000_000_000L;

    private String[] names;
    private int[] slots;
    private long[] perSignal;
    private long block = FNV_OFFSET;
    private long blockIndex;
    private final List<Long> blocks = new ArrayList<>();
    private long samples;

    @Override
    public void onStart(String[] signalNames, String[] signalUnits, long stepPeriodNs, int exchangeEverySteps) {
        List<Integer> keep = new ArrayList<>();
        for (int i = 0; i < signalNames.length; i++) {
            if (!WALL_CLOCK.contains(signalNames[i])) {
                keep.add(i);
            }
        }
        slots = keep.stream().mapToInt(Integer::intValue).toArray();
        names = new String[slots.length];
        for (int i = 0; i < slots.length; i++) {
            names[i] = signalNames[slots[i]];
        }
        perSignal = new long[slots.length];
        java.util.Arrays.fill(perSignal, FNV_OFFSET);
        blocks.clear();
    }

    private static long mix(long h, long bits) {
        long x = h;
        for (int b = 0; b < 8; b++) {
            x ^= (bits >>> (8 * b)) & 0xFF;
            x *= FNV_PRIME;
        }
        return x;
    }

    @Override
    public void onSample(Sample sample) {
        final long bi = (sample.plantTimeNs - 1) / BLOCK_NS;
        if (bi != blockIndex) {
            closeBlock();
            blockIndex = bi;
        }
        final double[] v = sample.values;
        final int[] s = slots;
        final long[] h = perSignal;
        long b = block;
        for (int i = 0; i < s.length; i++) {
            final long bits = Double.doubleToRawLongBits(v[s[i]]);
            h[i] = mix(h[i], bits);
            b = mix(b, bits);
        }
        block = b;
        samples++;
    }

    private void closeBlock() {
        // one boxed Long per second of plant time: negligible and bounded by the run length / 1 s
        blocks.add(block);
        block = FNV_OFFSET;
    }

    @Override
    public void onEnd(long samplesMissed) {
        closeBlock();
        if (samplesMissed > 0) {
            samples = -samplesMissed;
        }
    }

    /** The digest as text: header, one line per signal, one line per block. */
    public String text() {
        StringBuilder b = new StringBuilder("# galebench waveform digest v1: FNV-1a 64 over raw double bits\n");
        b.append("samples ").append(samples).append('\n');
        for (int i = 0; i < names.length; i++) {
            b.append("signal ").append(names[i]).append(' ').append(String.format(Locale.ROOT, "%016x", perSignal[i]))
                    .append('\n');
        }
        for (int i = 0; i < blocks.size(); i++) {
            b.append("block ").append(i).append(' ').append(String.format(Locale.ROOT, "%016x", blocks.get(i)))
                    .append('\n');
        }
        return b.toString();
    }

    public void write(Path file) throws IOException {
        Files.writeString(file, text(), StandardCharsets.UTF_8);
    }

    /** Parsed digest file: samples, signal digests and block digests, in file order. */
    public record Parsed(long samples, Map<String, String> signals, List<String> blocks) {
        public static Parsed of(String text) {
            long n = -1;
            Map<String, String> sig = new LinkedHashMap<>();
            List<String> bl = new ArrayList<>();
            for (String line : text.split("\n")) {
                String[] f = line.trim().split(" ");
                if (f[0].equals("samples")) {
                    n = Long.parseLong(f[1]);
                } else if (f[0].equals("signal") && f.length == 3) {
                    sig.put(f[1], f[2]);
                } else if (f[0].equals("block") && f.length == 3) {
                    bl.add(f[2]);
                }
            }
            return new Parsed(n, sig, bl);
        }

        /** Empty if equal; otherwise sentences naming what differs. */
        public List<String> differences(Parsed other) {
            List<String> d = new ArrayList<>();
            if (samples != other.samples) {
                d.add("sample count " + samples + " vs " + other.samples);
            }
            for (int i = 0; i < Math.min(blocks.size(), other.blocks.size()); i++) {
                if (!blocks.get(i).equals(other.blocks.get(i))) {
                    d.add("first differing second of plant time: " + i + " s .. " + (i + 1) + " s");
                    break;
                }
            }
            List<String> sigs = new ArrayList<>();
            for (Map.Entry<String, String> e : signals.entrySet()) {
                String o = other.signals.get(e.getKey());
                if (o == null || !o.equals(e.getValue())) {
                    sigs.add(e.getKey());
                }
            }
            if (!sigs.isEmpty()) {
                d.add("signals that differ: " + String.join(", ", sigs));
            }
            return d;
        }
    }
}
