// Prints rows as a plain text table with aligned columns.

/** columns: [{ title, value(row) , align: 'left' | 'right' }] */
export function printTable(columns, rows) {
  const cells = rows.map((row) => columns.map((column) => String(column.value(row) ?? '')));
  const widths = columns.map((column, i) =>
    Math.max(column.title.length, ...cells.map((line) => line[i].length)),
  );
  const pad = (text, i) =>
    columns[i].align === 'left' ? text.padEnd(widths[i]) : text.padStart(widths[i]);
  console.log(columns.map((column, i) => pad(column.title, i)).join('  '));
  console.log(widths.map((w) => '-'.repeat(w)).join('  '));
  for (const line of cells) console.log(line.map(pad).join('  '));
}
