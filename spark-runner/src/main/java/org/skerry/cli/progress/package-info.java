/** The progress display of a run on a terminal or in a log: {@link org.skerry.cli.progress.ProgressDisplay}. */
package org.skerry.cli.progress;
