package org.skerry.engine.model;

/**
 * A {@link ModelSource} that builds another source's model and asks backends to retry its
 * invalid likelihood calls. It has the other source's id, so executors that cache models per
 * source id build the model once for both.
 */
final class RetriedModelSource implements ModelSource {

    private static final long serialVersionUID = 1L;

    private final ModelSource source;
    private final int retries;

    RetriedModelSource(ModelSource source, int retries) {
        this.source = source;
        this.retries = retries;
    }

    @Override
    public Model create() {
        return source.create();
    }

    @Override
    public String id() {
        return source.id();
    }

    @Override
    public boolean isPortable() {
        return source.isPortable();
    }

    @Override
    public int evaluationRetries() {
        return retries;
    }

    @Override
    public ModelSource withEvaluationRetries(int value) {
        return source.withEvaluationRetries(value);
    }
}
