/**
 * Stopping a run early and resumably: on a termination signal within a grace period, or before
 * an iteration that the wall time left cannot fit. Either way the run ends on a checkpoint with
 * exit code 75, and {@code skerry resume} continues it.
 */
package org.skerry.cli.stop;
