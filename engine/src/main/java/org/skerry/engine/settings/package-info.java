/**
 * Settings read from Typesafe Config, with one set of rules for every file a user writes (run,
 * batch and study files) and for model settings: {@link org.skerry.engine.settings.SettingsReader}
 * reads typed values and reports bad ones as a {@link org.skerry.engine.settings.SettingsException}
 * naming the file, line, key and value. Used on the driver and, for model settings, on executors.
 */
package org.skerry.engine.settings;
