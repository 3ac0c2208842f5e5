package org.skerry.engine.model.settings;

import java.lang.reflect.Constructor;
import java.lang.reflect.InvocationTargetException;
import org.skerry.engine.model.Model;

/**
 * Creates a model from a built-in name (a {@link ModelFactory} in the {@link ModelCatalog}) or a
 * class name (a {@link ModelFactory}, or a {@link Model} with a public constructor taking
 * {@link ModelSettings} or none) and its settings. The driver and every executor run this same
 * code, so they build the same model.
 */
public final class ModelCreator {

    private ModelCreator() {
    }

    /**
     * @param modelName  the built-in model's name, or null
     * @param modelClass the class name when {@code modelName} is null
     * @param where      where the class name is written, for messages
     * @throws IllegalArgumentException from the factory or constructor: a bad setting
     * @throws ModelNotCreatedException when the class cannot be found or used
     */
    public static Model create(String modelName, String modelClass, ModelSettings settings, String where) {
        Model model = modelName != null ? ModelCatalog.load().get(modelName).create(settings)
                : fromClass(modelClass, settings, where);
        if (model == null) {
            throw new ModelNotCreatedException("model " + (modelName != null ? modelName : modelClass)
                    + ": the factory returned no model");
        }
        return model;
    }

    private static Model fromClass(String className, ModelSettings settings, String where) {
        Class<?> type;
        try {
            type = Class.forName(className, true, Thread.currentThread().getContextClassLoader());
        } catch (ClassNotFoundException | LinkageError e) {
            throw new ModelNotCreatedException(where + ": model.class = \"" + className + "\": "
                    + (e instanceof ClassNotFoundException ? "class not found on the classpath"
                            : "the class cannot be loaded (" + e + ")")
                    + "; put its jar on SKERRY_CLASSPATH (SKERRY_CLASSPATH=/path/model.jar bin/skerry …) and, for "
                    + "executors of their own (a cluster, local-cluster), also list it in backend.jars", e);
        }
        try {
            if (ModelFactory.class.isAssignableFrom(type)) {
                ModelFactory factory = (ModelFactory) type.getConstructor().newInstance();
                return factory.create(settings);
            }
            if (Model.class.isAssignableFrom(type)) {
                try {
                    Constructor<?> withSettings = type.getConstructor(ModelSettings.class);
                    return (Model) withSettings.newInstance(settings);
                } catch (NoSuchMethodException e) {
                    return (Model) type.getConstructor().newInstance();
                }
            }
        } catch (NoSuchMethodException e) {
            throw new ModelNotCreatedException(where + ": " + className
                    + " needs a public constructor taking ModelSettings, or none");
        } catch (InvocationTargetException e) {
            Throwable cause = e.getCause();
            if (cause instanceof IllegalArgumentException) {
                throw (IllegalArgumentException) cause;
            }
            throw new ModelNotCreatedException("model class " + className + " failed to start: " + cause, cause);
        } catch (ReflectiveOperationException e) {
            throw new ModelNotCreatedException("model class " + className + " cannot be created: " + e, e);
        }
        throw new ModelNotCreatedException(where + ": " + className
                + " is neither an org.skerry.engine.model.Model nor an org.skerry.engine.model.settings.ModelFactory");
    }
}
