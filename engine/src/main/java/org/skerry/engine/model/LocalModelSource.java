package org.skerry.engine.model;

/**
 * A {@link ModelSource} holding a model of this JVM. Serialising it is refused: the model is not
 * rebuilt elsewhere, and sending it would silently require the model to be serialisable.
 */
final class LocalModelSource implements ModelSource {

    private static final long serialVersionUID = 1L;

    private final transient Model model;

    LocalModelSource(Model model) {
        this.model = model;
    }

    @Override
    public Model create() {
        if (model == null) {
            throw new IllegalStateException("a local model source was sent to another JVM; build the model from a "
                    + "run file (model.name or model.class) or implement ModelSource");
        }
        return model;
    }

    @Override
    public String id() {
        return "local-" + System.identityHashCode(model);
    }

    @Override
    public boolean isPortable() {
        return false;
    }

    private void writeObject(java.io.ObjectOutputStream out) throws java.io.NotSerializableException {
        throw new java.io.NotSerializableException("model " + model.getClass().getName()
                + " lives in this JVM only; build it from a run file (model.name or model.class) or implement ModelSource");
    }
}
