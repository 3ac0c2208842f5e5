/**
 * Stopping a run early and resumably: on a termination signal (SIGTERM) or Ctrl-C (SIGINT) within
 * a grace period, or before an iteration that the wall time left cannot fit. Either way the run
 * ends on a checkpoint with exit code 75, and {@code skerry resume} continues it; Ctrl-C pressed
 * again, or a grace period too short for the iteration in flight, abandons that iteration at once
 * (also exit code 75, on the last checkpoint written).
 */
package org.skerry.cli.stop;
