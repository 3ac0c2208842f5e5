/**
 * Input data: {@link org.skerry.cli.data.DataTable}, named numeric columns that remember their
 * source lines, read from CSV files by {@link org.skerry.cli.data.CsvDataReader} or built from
 * inline rows; every problem a {@link org.skerry.cli.data.DataException} naming file, line and
 * column.
 */
package org.skerry.cli.data;
