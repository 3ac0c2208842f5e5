/**
 * The Spark backend: a population's blocks as a cached RDD with one particle block per partition
 * ({@link org.skerry.spark.SparkBlocks}), behind the engine's
 * {@link org.skerry.engine.population.BlockExecutor}. It runs the engine's block steps on the
 * executors, moves runs of particles between partitions and writes and reads blocks; the
 * algorithm itself stays in the engine. This module, the engine and the checkpoint module are all
 * an executor needs.
 */
package org.skerry.spark;
