package org.skerry.engine.particle;

import java.io.DataInput;
import java.io.DataOutput;
import java.io.IOException;

/**
 * The byte form of a {@link ParticleBlock} for checkpoint files: a magic number, a format version,
 * the shape, then each array as raw IEEE-754 bits (so every value reads back bit for bit on any
 * JVM). Only the {@link ParticleBlock#size()} live particles are written. A block without
 * auxiliary values is written in format 1, as before they existed; one with them in format 2,
 * which adds the width and the values at the end.
 */
public final class ParticleBlockCodec {

    /** "SKBL" in ASCII. */
    static final int MAGIC = 0x534B424C;
    static final int VERSION = 1;
    /** Format 1 followed by the auxiliary width and values. */
    static final int VERSION_AUXILIARY = 2;

    private ParticleBlockCodec() {
    }

    /** Writes {@code block} to {@code out}. */
    public static void write(ParticleBlock block, DataOutput out) throws IOException {
        int size = block.size();
        int d = block.dimension();
        out.writeInt(MAGIC);
        int width = block.auxiliaryWidth();
        out.writeInt(width == 0 ? VERSION : VERSION_AUXILIARY);
        out.writeInt(d);
        out.writeInt(size);
        writeDoubles(out, block.values(), size * d);
        writeDoubles(out, block.logPrior(), size);
        writeDoubles(out, block.logLikelihood(), size);
        writeDoubles(out, block.logWeight(), size);
        writeLongs(out, block.index(), size);
        writeLongs(out, block.eve(), size);
        if (width > 0) {
            out.writeInt(width);
            writeDoubles(out, block.auxiliary(), size * width);
        }
    }

    /**
     * Reads a block written by {@link #write}.
     *
     * @throws IOException when the bytes are not a block of this format (the message says why)
     */
    public static ParticleBlock read(DataInput in) throws IOException {
        int magic = in.readInt();
        if (magic != MAGIC) {
            throw new IOException("not a particle block (magic number " + Integer.toHexString(magic) + ")");
        }
        int version = in.readInt();
        if (version != VERSION && version != VERSION_AUXILIARY) {
            throw new IOException("particle block format version " + version + "; this build reads " + VERSION
                    + " and " + VERSION_AUXILIARY);
        }
        int d = in.readInt();
        int size = in.readInt();
        if (d <= 0 || size < 0) {
            throw new IOException("particle block with dimension " + d + " and size " + size);
        }
        double[] values = readDoubles(in, Math.multiplyExact(size, d));
        double[] logPrior = readDoubles(in, size);
        double[] logLikelihood = readDoubles(in, size);
        double[] logWeight = readDoubles(in, size);
        long[] index = readLongs(in, size);
        long[] eve = readLongs(in, size);
        if (version == VERSION) {
            return new ParticleBlock(d, size, values, logPrior, logLikelihood, logWeight, index, eve);
        }
        int width = in.readInt();
        if (width < 1 || width > 1 << 20) {
            throw new IOException("particle block with " + width + " auxiliary values per particle");
        }
        double[] auxiliary = readDoubles(in, Math.multiplyExact(size, width));
        return new ParticleBlock(d, size, values, logPrior, logLikelihood, logWeight, index, eve, width, auxiliary);
    }

    private static void writeDoubles(DataOutput out, double[] values, int count) throws IOException {
        for (int i = 0; i < count; i++) {
            out.writeLong(Double.doubleToRawLongBits(values[i]));
        }
    }

    private static void writeLongs(DataOutput out, long[] values, int count) throws IOException {
        for (int i = 0; i < count; i++) {
            out.writeLong(values[i]);
        }
    }

    private static double[] readDoubles(DataInput in, int count) throws IOException {
        double[] values = new double[count];
        for (int i = 0; i < count; i++) {
            values[i] = Double.longBitsToDouble(in.readLong());
        }
        return values;
    }

    private static long[] readLongs(DataInput in, int count) throws IOException {
        long[] values = new long[count];
        for (int i = 0; i < count; i++) {
            values[i] = in.readLong();
        }
        return values;
    }
}
