/**
 * The Spark backend: a population as a cached RDD with one particle block per partition. Classes
 * here run on the driver ({@link org.skerry.spark.SparkBackend}, {@link org.skerry.spark.SparkPopulation})
 * and ship closures that call the engine's block-side code on the executors; the sampler loop
 * itself stays in the engine.
 */
package org.skerry.spark;
