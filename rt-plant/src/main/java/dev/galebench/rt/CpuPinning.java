package dev.galebench.rt;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.concurrent.TimeUnit;

/**
 * Pins the calling thread to one CPU on Linux by running {@code taskset -p -c CPU TID} on the
 * thread's own kernel id (read from {@code /proc/thread-self}). Java has no affinity API; this
 * costs a process start (milliseconds) and is done once, on the loop thread, before the first
 * deadline. Pinning only pays off on a core kept free of other work (see rt-plant/LOOP.md:
 * {@code isolcpus}, {@code nohz_full}); on a shared VM it may change nothing.
 */
final class CpuPinning {
    private CpuPinning() {
    }

    /** Pins the current thread; returns a one-line outcome ("pinned to CPU 1" or why not). */
    static String pinCurrentThread(int cpu) {
        try {
            final Path self = Files.readSymbolicLink(Path.of("/proc/thread-self"));
            final String tid = self.getFileName().toString();
            final Process p = new ProcessBuilder("taskset", "-p", "-c", Integer.toString(cpu), tid)
                    .redirectErrorStream(true).start();
            final String out = new String(p.getInputStream().readAllBytes()).trim();
            if (!p.waitFor(5, TimeUnit.SECONDS)) {
                p.destroy();
                return "not pinned: taskset did not finish";
            }
            return p.exitValue() == 0 ? "pinned to CPU " + cpu + " (tid " + tid + ")"
                    : "not pinned: taskset exit " + p.exitValue() + ": " + out;
        } catch (IOException e) {
            return "not pinned: " + e.getMessage();
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            return "not pinned: interrupted";
        }
    }
}
