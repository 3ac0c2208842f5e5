/**
 * The files of a run folder: {@code summary.json}, {@code timing.json}, {@code iterations.csv},
 * {@code particles.csv} and {@code run.conf}, each written atomically ({@link
 * org.skerry.cli.output.AtomicFile}) with doubles in one JDK-independent text form ({@link
 * org.skerry.cli.output.DoubleText}); and {@code particles.arrow}, the final population's bits in
 * Arrow's IPC file format ({@link org.skerry.cli.output.ParticlesArrow}), staged and moved into
 * place the same way. Everything but {@code timing.json} and the seconds columns
 * of {@code iterations.csv} is the same, byte for byte, for the same settings and seed.
 */
package org.skerry.cli.output;
