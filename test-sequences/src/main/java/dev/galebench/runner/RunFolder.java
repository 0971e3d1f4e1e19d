package dev.galebench.runner;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.ZoneOffset;
import java.time.ZonedDateTime;
import java.time.format.DateTimeFormatter;

/** The folder of one run: {@code <base>/<sequence>-<yyyyMMdd-HHmmss>} (UTC), made unique with a suffix. */
final class RunFolder {
    private static final DateTimeFormatter STAMP = DateTimeFormatter.ofPattern("yyyyMMdd-HHmmss");

    private RunFolder() {
    }

    static Path create(Path base, String sequenceName, ZonedDateTime now) throws IOException {
        String stem = sequenceName + "-" + STAMP.format(now.withZoneSameInstant(ZoneOffset.UTC));
        Files.createDirectories(base);
        Path dir = base.resolve(stem);
        for (int i = 2; Files.exists(dir); i++) {
            dir = base.resolve(stem + "-" + i);
        }
        return Files.createDirectory(dir);
    }
}
