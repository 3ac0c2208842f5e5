// Reads an Arrow IPC file with the JavaScript Apache Arrow library (not Arrow Java, which wrote
// it) and prints, for ArrowIndependentReaderTest: a line per column "name<TAB>type<TAB>nullable",
// a line "rows<TAB>N<TAB>batches<TAB>B", then per column one line of its values' IEEE-754 bits as
// 16 hex digits separated by spaces, so the Java side compares bits, not decimal text.
import { readFileSync } from 'node:fs';
import { tableFromIPC } from 'apache-arrow';

const table = tableFromIPC(readFileSync(process.argv[2]));
const out = [];
for (const field of table.schema.fields) {
  out.push(`${field.name}\t${field.type}\t${field.nullable}`);
}
out.push(`rows\t${table.numRows}\tbatches\t${table.batches.length}`);
for (const field of table.schema.fields) {
  const column = table.getChild(field.name);
  const bits = [];
  for (const chunk of column.data) {
    const values = chunk.values; // the Float64Array over the column's data buffer
    const words = new BigUint64Array(values.buffer, values.byteOffset, chunk.length);
    for (const word of words) {
      bits.push(word.toString(16).padStart(16, '0'));
    }
  }
  out.push(bits.join(' '));
}
process.stdout.write(out.join('\n') + '\n');
