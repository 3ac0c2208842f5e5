/**
 * The command-line program: commands, run files, data input, run outputs and progress display.
 * Runs on the driver.
 */
package org.skerry.cli;
