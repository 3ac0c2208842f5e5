package org.skerry.spark;

import java.io.Serializable;

/**
 * How a population's blocks map onto Spark tasks. Per block: one partition, and one task per step,
 * for each block (the scheduler balances blocks, each task pays Spark's fixed cost). Per executor:
 * a partition holds a group of consecutive blocks, and its task works through them on
 * {@code spark.task.cpus} threads that take the next unstarted block as they finish one, so a slow
 * block is balanced inside the executor and a step costs one task per group whatever the block
 * count. Blocks stay the algorithm's unit: the answer is the same either way.
 */
public final class TaskGrouping implements Serializable {

    private static final long serialVersionUID = 1L;

    /** −1 per block; 0 one group per task slot (executor); otherwise the group count. */
    private final int groups;

    private TaskGrouping(int groups) {
        this.groups = groups;
    }

    /** A task per block. */
    public static TaskGrouping perBlock() {
        return new TaskGrouping(-1);
    }

    /**
     * Groups of consecutive blocks, a task each.
     *
     * @param groups the group count; 0 for one group per task slot, which is one per executor when
     *               {@code spark.task.cpus} equals the executors' cores
     */
    public static TaskGrouping perExecutor(int groups) {
        if (groups < 0) {
            throw new IllegalArgumentException("groups must be >= 0, was " + groups);
        }
        return new TaskGrouping(groups);
    }

    /** Whether each block is a task of its own. */
    public boolean isPerBlock() {
        return groups < 0;
    }

    /**
     * Groups for {@code blocks} blocks when Spark runs {@code slots} tasks at once: never more than
     * the blocks, at least one.
     */
    int groupsFor(int blocks, int slots) {
        int wanted = groups < 0 ? blocks : groups == 0 ? slots : groups;
        return Math.max(1, Math.min(wanted, blocks));
    }

    /**
     * Block numbers where each group starts, and the block count at the end: group g holds blocks
     * {@code [start[g], start[g+1])}, as even as the counts allow, in block order.
     */
    static int[] starts(int blocks, int groups) {
        int[] start = new int[groups + 1];
        for (int g = 0; g <= groups; g++) {
            start[g] = (int) ((long) g * blocks / groups);
        }
        return start;
    }

    @Override
    public String toString() {
        return groups < 0 ? "a task per block" : groups == 0 ? "a task per executor" : groups + " tasks per step";
    }
}
