// Command-line analysis: reads a long-form strip CSV and prints the trial analysis as JSON.
import { readFileSync } from 'node:fs';
import Papa from 'papaparse';
import { analyzeTrial, type StripObservation } from '../../shared/analysis/index';
import { csvDelimiter } from '../../shared/import/parse-import';
import { parseDecimal } from '../../shared/units/parse-decimal';

class InputError extends Error {}

const USAGE = 'usage: analyze FILE.csv [--response yield] [--reference 1] [--alpha 0.05]';

function parseArguments(argv: readonly string[]): {
  file: string;
  response?: string;
  reference?: string;
  alpha?: number;
} {
  let file: string | undefined;
  const options: { response?: string; reference?: string; alpha?: number } = {};
  for (let i = 0; i < argv.length; i++) {
    const argument = argv[i] as string;
    const [flag, inline] = argument.startsWith('--')
      ? argument.split('=', 2)
      : [argument, undefined];
    if (flag === '--response' || flag === '--reference' || flag === '--alpha') {
      const value = inline ?? argv[++i];
      if (value === undefined) throw new InputError(`${flag} needs a value`);
      if (flag === '--response') options.response = value;
      else if (flag === '--reference') options.reference = value;
      else {
        const alpha = Number(value);
        if (!(alpha > 0 && alpha < 1))
          throw new InputError(`--alpha must be between 0 and 1 (got ${value})`);
        options.alpha = alpha;
      }
    } else if (argument.startsWith('--'))
      throw new InputError(`unknown option ${argument}; ${USAGE}`);
    else if (file === undefined) file = argument;
    else throw new InputError(`unexpected argument ${argument}; ${USAGE}`);
  }
  if (file === undefined) throw new InputError(USAGE);
  return { file, ...options };
}

function readRows(text: string, wanted?: string): { response: string; rows: StripObservation[] } {
  const clean = text.replace(/^\uFEFF/, '');
  const parsed = Papa.parse<Record<string, string>>(clean, {
    header: true,
    // A spreadsheet set to a decimal comma saves with semicolons.
    delimiter: csvDelimiter(clean),
    skipEmptyLines: 'greedy',
    transformHeader: (header) => header.trim(),
  });
  const badRow = parsed.errors.find((error) => error.type !== 'Delimiter');
  if (badRow) throw new InputError(`row ${(badRow.row ?? 0) + 2}: ${badRow.message}`);
  const columns = parsed.meta.fields ?? [];
  for (const required of ['site', 'block', 'rate']) {
    if (!columns.includes(required))
      throw new InputError(`row 1 (header), column "${required}": missing`);
  }
  const candidates = columns.filter((column) => !['site', 'block', 'rate'].includes(column));
  let response: string;
  if (wanted !== undefined) {
    if (!columns.includes(wanted))
      throw new InputError(`row 1 (header), column "${wanted}": missing`);
    response = wanted;
  } else if (candidates.includes('yield')) response = 'yield';
  else {
    // Never guess: a numeric column may be plot numbers. Name the ones that could be meant.
    const numeric = candidates.filter((column) =>
      parsed.data.some((row) => {
        const read = parseDecimal(row[column] ?? '');
        return read.ok && read.value !== null;
      }),
    );
    throw new InputError(
      numeric.length === 0
        ? 'row 1 (header): no "yield" column and no other numeric column to analyse'
        : `row 1 (header): no "yield" column; name the response with --response (numeric columns: ${numeric.join(', ')})`,
    );
  }
  const blocksBySite = new Map<string, { blocks: Set<string>; firstRow: number }>();
  const rows = parsed.data.map((record, index) => {
    const rowNumber = index + 2;
    const field = (column: string) => (record[column] ?? '').trim();
    for (const column of ['site', 'block', 'rate']) {
      if (field(column) === '') throw new InputError(`row ${rowNumber}, column "${column}": empty`);
    }
    const raw = field(response);
    const read = parseDecimal(raw);
    if (!read.ok)
      throw new InputError(`row ${rowNumber}, column "${response}": "${raw}": ${read.message}`);
    const value = read.value;
    const site = field('site');
    const entry = blocksBySite.get(site) ?? { blocks: new Set<string>(), firstRow: rowNumber };
    entry.blocks.add(field('block'));
    blocksBySite.set(site, entry);
    return { site, block: field('block'), rate: field('rate'), value };
  });
  if (rows.length === 0) throw new InputError('row 2: the file has no data rows');
  for (const [site, { blocks, firstRow }] of blocksBySite) {
    if (blocks.size < 2) {
      throw new InputError(
        `row ${firstRow}, column "block": site "${site}" has only one block; a site needs at least 2`,
      );
    }
  }
  return { response, rows };
}

function main(): number {
  try {
    const args = parseArguments(process.argv.slice(2));
    let text: string;
    try {
      text = readFileSync(args.file, 'utf8');
    } catch {
      throw new InputError(`cannot read ${args.file}`);
    }
    const { response, rows } = readRows(text, args.response);
    const result = analyzeTrial(rows, { response, reference: args.reference, alpha: args.alpha });
    process.stdout.write(`${JSON.stringify(result, null, 2)}\n`);
    return 0;
  } catch (error) {
    process.stderr.write(`analyze: ${(error as Error).message.split('\n')[0]}\n`);
    return 2;
  }
}

process.exitCode = main();
