package org.skerry.spark;

import com.esotericsoftware.kryo.Kryo;
import com.esotericsoftware.kryo.KryoException;
import com.esotericsoftware.kryo.Serializer;
import com.esotericsoftware.kryo.io.Input;
import com.esotericsoftware.kryo.io.Output;
import com.esotericsoftware.kryo.serializers.JavaSerializer;
import org.apache.spark.serializer.KryoRegistrator;
import org.skerry.engine.math.ExactSum;
import org.skerry.engine.move.MoveKernel;
import org.skerry.engine.move.Proposal;
import org.skerry.engine.particle.ParticleBlock;
import org.skerry.engine.population.BlockReports;
import org.skerry.engine.population.EvaluationTally;
import org.skerry.engine.population.MomentSums;
import org.skerry.engine.population.MoveTally;
import org.skerry.engine.population.StoredBlock;
import org.skerry.engine.resample.BlockResamplingPlan;
import org.skerry.engine.resample.ResamplingScheme;
import org.skerry.engine.resample.ResidualTotals;

/**
 * Registers every class of ours that Spark serialises with Kryo (cached partitions, shuffled runs
 * of particles, collected reports), so {@code spark.kryo.registrationRequired=true} can catch an
 * unregistered class instead of silently writing class names.
 */
public final class SkerryKryoRegistrator implements KryoRegistrator {

    @Override
    public void registerClasses(Kryo kryo) {
        kryo.register(ParticleBlock.class, new ParticleBlockSerializer());
        kryo.register(PartitionState.class);
        kryo.register(ModelShipment.class, new JavaSerializer());
        kryo.register(BlockReports.Weights.class);
        kryo.register(BlockReports.Drawn.class);
        kryo.register(BlockReports.Moved.class);
        kryo.register(BlockReports.Totals.class);
        kryo.register(BlockReports.Resampled.class);
        kryo.register(BlockReports.Increments.class);
        kryo.register(BlockReports.Auxiliary.class);
        kryo.register(EvaluationTally.class);
        kryo.register(MoveTally.class);
        kryo.register(MomentSums.class, new MomentSumsSerializer());
        kryo.register(ExactSum.class);
        kryo.register(ExactSum[].class);
        kryo.register(Proposal.class);
        kryo.register(MoveKernel.class);
        kryo.register(ResamplingScheme.class);
        kryo.register(BlockResamplingPlan.class);
        kryo.register(ResidualTotals.class);
        kryo.register(double[].class);
        kryo.register(double[][].class);
        kryo.register(long[].class);
        kryo.register(long[][].class);
        kryo.register(int[].class);
        kryo.register(boolean[].class);
        kryo.register(Object[].class);
        kryo.register(ParticleBlock[].class);
        kryo.register(StoredBlock.class);
    }

    /**
     * Moment sums in their compact form ({@link MomentSums#toCompactArray()}): Kryo's field
     * serialiser would write all 67 chunks of every exact sum.
     */
    static final class MomentSumsSerializer extends Serializer<MomentSums> {

        @Override
        public void write(Kryo kryo, Output output, MomentSums sums) {
            long[] compact = sums.toCompactArray();
            output.writeInt(compact.length, true);
            output.writeLongs(compact);
        }

        @Override
        public MomentSums read(Kryo kryo, Input input, Class<MomentSums> type) {
            int length = input.readInt(true);
            try {
                return MomentSums.fromCompactArray(input.readLongs(length));
            } catch (IllegalArgumentException e) {
                throw new KryoException(e.getMessage(), e);
            }
        }
    }
}
