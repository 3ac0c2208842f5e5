package org.skerry.spark;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.esotericsoftware.kryo.Kryo;
import com.esotericsoftware.kryo.serializers.FieldSerializer;
import java.nio.ByteBuffer;
import java.util.SplittableRandom;
import org.apache.spark.SparkConf;
import org.apache.spark.serializer.KryoRegistrator;
import org.apache.spark.serializer.KryoSerializer;
import org.apache.spark.serializer.SerializerInstance;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.skerry.engine.population.MomentSums;
import scala.reflect.ClassTag;
import scala.reflect.ClassTag$;

/**
 * Moment sums through Spark's own {@link KryoSerializer} with our registrator, as collected
 * results travel: the same moments bit for bit, in a small fraction of the bytes Kryo's field
 * serialiser (the registration before the compact form) writes.
 */
class MomentSumsKryoTest {

    private static final ClassTag<MomentSums> TAG = ClassTag$.MODULE$.apply(MomentSums.class);

    private static MomentSums filled(int d, long seed) {
        SplittableRandom random = new SplittableRandom(seed);
        MomentSums sums = new MomentSums(d);
        double[] z = new double[d];
        for (int i = 0; i < 1000; i++) {
            for (int k = 0; k < d; k++) {
                z[k] = 3.0 * (k + 1) + StrictMath.exp(k - 3.0) * random.nextGaussian();
            }
            sums.add(StrictMath.exp(2.0 * random.nextGaussian()) / 1000.0, z);
        }
        return sums;
    }

    /** Our registration as it was before the compact form: Kryo's field serialiser for moment sums. */
    public static final class FieldSerializerRegistration implements KryoRegistrator {

        @Override
        public void registerClasses(Kryo kryo) {
            new SkerryKryoRegistrator().registerClasses(kryo);
            kryo.register(MomentSums.class, new FieldSerializer<>(kryo, MomentSums.class));
        }
    }

    private static SerializerInstance kryo(Class<? extends KryoRegistrator> registrator) {
        SparkConf conf = new SparkConf().set("spark.kryo.registrator", registrator.getName())
                .set("spark.kryo.registrationRequired", "true");
        return new KryoSerializer(conf).newInstance();
    }

    @ParameterizedTest
    @ValueSource(ints = {2, 10})
    @DisplayName("moment sums round-trip through Spark's Kryo serialiser exactly, at under a tenth of the field serialiser's size")
    void kryoRoundTrip(int d) {
        SerializerInstance kryo = kryo(SkerryKryoRegistrator.class);
        MomentSums sums = filled(d, 60L + d);
        ByteBuffer bytes = kryo.serialize(sums, TAG);
        int size = bytes.remaining();
        MomentSums back = kryo.deserialize(bytes, TAG);
        assertEquals(Double.doubleToRawLongBits(sums.totalWeight()), Double.doubleToRawLongBits(back.totalWeight()));
        assertArrayEquals(sums.mean(), back.mean());
        assertArrayEquals(sums.covariance(), back.covariance());
        assertArrayEquals(sums.toCompactArray(), back.toCompactArray());
        int before = kryo(FieldSerializerRegistration.class).serialize(sums, TAG).remaining();
        assertTrue(10 * size < before, "d=" + d + ": " + size + " bytes, field serialiser " + before);
    }
}
