package org.skerry.cli.output;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class RunConfFileTest {

    @TempDir
    Path folder;

    @Test
    @DisplayName("run.conf holds a version comment, then the settings text, ending with a line break")
    void writesText() throws IOException {
        Path file = RunConfFile.write(folder, "0.1.0", "model {\n  name = \"normal-mean\"\n}");
        assertEquals(folder.resolve("run.conf"), file);
        assertEquals("# resolved settings, written by skerry 0.1.0\nmodel {\n  name = \"normal-mean\"\n}\n",
                Files.readString(file));
        RunConfFile.write(folder, null, "particles = 1000\n");
        assertEquals("particles = 1000\n", Files.readString(file));
        RunConfFile.write(folder, "1.0\nrogue = true", "σ = 1\n");
        assertEquals("# resolved settings, written by skerry 1.0 rogue = true\nσ = 1\n", Files.readString(file));
    }
}
