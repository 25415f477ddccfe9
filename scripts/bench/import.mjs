// Bench part "import": a 5,000-row CSV import into the invented import site, timed end to end.

export async function runImport({ base, ids, headers }) {
  console.log('\n== CSV import of 5,000 rows ==');
  const template = await fetch(`${base}/api/sites/${ids.importSiteId}/import-template.csv`, {
    headers,
  });
  if (template.status !== 200) {
    console.log(`import: template route answered ${template.status}; skipped`);
    return { skipped: `template route answered ${template.status}` };
  }
  const text = await template.text();
  const lines = text.trim().split(/\r?\n/);
  const header = lines[0].split(',');
  const col = (name) => header.indexOf(name);
  const filled = [lines[0]];
  for (const [i, line] of lines.slice(1).entries()) {
    const cells = line.split(',');
    const set = (name, value) => {
      if (col(name) >= 0) cells[col(name)] = String(value);
    };
    set('grain_weight_lb', (4 + (i % 7) * 0.1).toFixed(2));
    set('moisture_pct', '13.5');
    set('harvest_rows', '4');
    set('harvest_length_ft', '50');
    set('stand_1', String(30 + (i % 5)));
    set('stand_row_length_ft', '3');
    filled.push(cells.join(','));
  }
  const form = new FormData();
  form.append('file', new Blob([filled.join('\n')], { type: 'text/csv' }), 'bench.csv');
  const started = performance.now();
  const res = await fetch(`${base}/api/sites/${ids.importSiteId}/import`, {
    method: 'POST',
    headers,
    body: form,
  });
  const ms = performance.now() - started;
  const body = await res.text();
  const result = { rows: filled.length - 1, status: res.status, milliseconds: Math.round(ms) };
  console.log(
    `import of ${result.rows} rows: HTTP ${res.status} in ${result.milliseconds} ms${res.status >= 300 ? ` (${body.slice(0, 200)})` : ''}`,
  );
  return result;
}
