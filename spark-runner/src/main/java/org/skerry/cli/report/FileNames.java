package org.skerry.cli.report;

/** File-name parts made from parameter names: letters, digits, '_' and '-' kept, anything else '_'. */
final class FileNames {

    private FileNames() {
    }

    static String safe(String name) {
        String cleaned = name.replaceAll("[^A-Za-z0-9_-]", "_");
        // Long names are cut so the file name stays within every file system's limit.
        return cleaned.length() > 60 ? cleaned.substring(0, 60) : cleaned;
    }
}
