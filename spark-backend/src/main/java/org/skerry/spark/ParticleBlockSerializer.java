package org.skerry.spark;

import com.esotericsoftware.kryo.Kryo;
import com.esotericsoftware.kryo.Serializer;
import com.esotericsoftware.kryo.io.Input;
import com.esotericsoftware.kryo.io.Output;
import org.skerry.engine.particle.ParticleBlock;

/**
 * Kryo form of a {@link ParticleBlock}: dimension, size, auxiliary width, then each array cut to the block's size,
 * so spare capacity never crosses the network. Doubles travel as their exact bits.
 */
final class ParticleBlockSerializer extends Serializer<ParticleBlock> {

    @Override
    public void write(Kryo kryo, Output output, ParticleBlock block) {
        int n = block.size();
        int d = block.dimension();
        output.writeInt(d, true);
        output.writeInt(n, true);
        output.writeInt(block.auxiliaryWidth(), true);
        output.writeDoubles(cut(block.values(), n * d));
        output.writeDoubles(cut(block.logPrior(), n));
        output.writeDoubles(cut(block.logLikelihood(), n));
        output.writeDoubles(cut(block.logWeight(), n));
        output.writeLongs(cutLongs(block.index(), n));
        output.writeLongs(cutLongs(block.eve(), n));
        output.writeDoubles(cut(block.auxiliary(), n * block.auxiliaryWidth()));
    }

    private static double[] cut(double[] array, int length) {
        return array.length == length ? array : java.util.Arrays.copyOf(array, length);
    }

    private static long[] cutLongs(long[] array, int length) {
        return array.length == length ? array : java.util.Arrays.copyOf(array, length);
    }

    @Override
    public ParticleBlock read(Kryo kryo, Input input, Class<ParticleBlock> type) {
        int d = input.readInt(true);
        int n = input.readInt(true);
        int width = input.readInt(true);
        double[] values = input.readDoubles(n * d);
        double[] logPrior = input.readDoubles(n);
        double[] logLikelihood = input.readDoubles(n);
        double[] logWeight = input.readDoubles(n);
        long[] index = input.readLongs(n);
        long[] eve = input.readLongs(n);
        double[] auxiliary = input.readDoubles(n * width);
        return new ParticleBlock(d, n, values, logPrior, logLikelihood, logWeight, index, eve, width, auxiliary);
    }
}
