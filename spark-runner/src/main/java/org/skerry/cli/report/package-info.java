/**
 * {@code skerry report}: an HTML page with figures (PNG and SVG) for one finished run folder,
 * read back from its files — warnings first, the summary table, posterior histograms, a pair
 * plot and the per-iteration diagnostics. Runs on the command line's side only; it never starts
 * a backend.
 */
package org.skerry.cli.report;
