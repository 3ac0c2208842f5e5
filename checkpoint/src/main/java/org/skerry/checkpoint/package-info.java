/**
 * Checkpoints on any Hadoop-compatible file system: executors (or worker threads) write their own
 * blocks, the driver writes its state and, last, a manifest with a checksum of every file. A
 * checkpoint without a complete, valid manifest does not exist. Resuming picks the newest valid
 * checkpoint and reports the damaged ones it skips.
 */
package org.skerry.checkpoint;
