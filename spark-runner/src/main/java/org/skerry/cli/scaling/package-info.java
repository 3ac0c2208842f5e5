/**
 * Scaling studies ({@code skerry scale}): a study file names a base run file and a grid of
 * settings; every point is run as an ordinary analysis on the driver, measured (phase times from
 * the run itself, driver CPU time, bytes of task results the driver received) and tabulated with
 * speed-up and efficiency, plotted and summarised. Driver side only.
 */
package org.skerry.cli.scaling;
