package org.skerry.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import org.skerry.cli.output.AtomicFile;
import org.skerry.engine.model.plankton.QuellmarBuoy;
import org.skerry.engine.model.plankton.QuellmarData;
import org.skerry.engine.model.plankton.QuellmarScenario;
import org.skerry.engine.model.plankton.ZooplanktonRicker;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;
import picocli.CommandLine.Model.CommandSpec;

/**
 * {@code skerry generate-demo-data}: regenerates the synthetic Lake Quellmar data files from the
 * scenario's stated true parameters, so anyone can check the demo's data and its truth.
 */
@Command(name = "generate-demo-data", mixinStandardHelpOptions = true, versionProvider = Version.class,
        description = "Write the synthetic chlorophyll series of the twelve (invented) Lake Quellmar buoys, and the "
                + "north basin's zooplankton tow counts, as CSV files.")
final class DemoDataCommand implements Callable<Integer> {

    /** The seed the committed demo data were generated with. */
    static final long DEMO_SEED = 20261201L;

    @Spec
    CommandSpec spec;

    @Option(names = "--out", paramLabel = "DIR", description = "folder for the CSV files (default: <skerry home>/conf/demo/data)")
    Path out;

    @Option(names = "--seed", description = "noise seed (default: ${DEFAULT-VALUE}, the seed of the committed files)")
    long seed = DEMO_SEED;

    @Override
    public Integer call() {
        Path folder = out != null ? out
                : Path.of(System.getProperty("skerry.home", ".")).resolve("conf").resolve("demo").resolve("data");
        PrintWriter stdout = spec.commandLine().getOut();
        try {
            Files.createDirectories(folder);
            for (QuellmarBuoy buoy : QuellmarScenario.buoys()) {
                double[][] rows = QuellmarData.generate(buoy, seed);
                Path file = folder.resolve(buoy.name() + ".csv");
                AtomicFile.writeString(file, QuellmarData.toCsv(buoy, seed, rows));
                stdout.println("wrote " + file + " (" + rows.length + " weekly observations, synthetic)");
            }
            Path tows = folder.resolve(ZooplanktonRicker.DEMO_FILE);
            AtomicFile.writeString(tows, ZooplanktonRicker.demoCsv(seed));
            stdout.println("wrote " + tows + " (" + ZooplanktonRicker.DEMO_WEEKS + " weekly tow counts, synthetic)");
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write demo data into " + folder, e);
        }
        stdout.flush();
        return ExitCodes.SUCCESS;
    }
}
