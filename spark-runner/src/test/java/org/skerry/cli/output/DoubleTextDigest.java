package org.skerry.cli.output;

import java.nio.charset.StandardCharsets;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.HexFormat;

/** Prints the SHA-256 of the texts of {@link DoubleSamples} (seed, count from the arguments), to compare JVMs. */
public final class DoubleTextDigest {

    private DoubleTextDigest() {
    }

    public static void main(String[] args) throws NoSuchAlgorithmException {
        System.out.println(digest(Long.parseLong(args[0]), Integer.parseInt(args[1])));
    }

    /** The hex SHA-256 of {@code count} texts, each followed by a newline. */
    public static String digest(long seed, int count) throws NoSuchAlgorithmException {
        MessageDigest digest = MessageDigest.getInstance("SHA-256");
        DoubleSamples samples = new DoubleSamples(seed);
        for (int i = 0; i < count; i++) {
            digest.update(DoubleText.format(samples.next()).getBytes(StandardCharsets.US_ASCII));
            digest.update((byte) '\n');
        }
        return HexFormat.of().formatHex(digest.digest());
    }
}
