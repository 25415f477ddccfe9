// CSV upload: download the prefilled template, preview the chosen file with row errors
// (the same parser the server runs), then upload it: every row is saved, or none.
import { useMemo, useState } from 'react';
import { columnDocs } from '../../../../shared/import/columns';
import {
  csvDelimiter,
  parseImportCsv,
  type ParsedImport,
} from '../../../../shared/import/parse-import';
import type { ImportRowError } from '../../../../shared/schemas/import';
import type { SiteStrips } from '../../../../shared/schemas/strip';
import { Alert } from '../../../components/ui/alert';
import { Button, buttonClasses } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { isApiError } from '../../../lib/api-client';
import { errorSummary } from '../../../lib/form-errors';
import { plural } from '../../../lib/format';
import { templateUrl, useImportCsv } from '../api/import-csv';
import Papa from 'papaparse';

const PREVIEW_ROWS = 40;

function RowErrors({ errors }: { errors: ImportRowError[] }) {
  return (
    <table className="mt-2 w-full text-left text-caption" data-testid="import-errors">
      <thead>
        <tr>
          <th className="py-1 pr-2">Row</th>
          <th className="py-1 pr-2">Column</th>
          <th className="py-1">Problem</th>
        </tr>
      </thead>
      <tbody>
        {errors.slice(0, 50).map((e, i) => (
          <tr key={i} className="border-t border-danger/20">
            <td className="figures py-1 pr-2">{e.row}</td>
            <td className="py-1 pr-2 font-mono">{e.column || '—'}</td>
            <td className="py-1">{e.message}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

/** The first rows of the chosen file, with the cells in error marked. */
function PreviewTable({ table, errors }: { table: string[][]; errors: ParsedImport['errors'] }) {
  const errorCells = new Set(errors.map((e) => `${e.row}:${e.column}`));
  // A scrolling box takes keyboard focus so it can be scrolled without a mouse.
  return (
    <div
      className="max-h-96 overflow-auto rounded-field border border-line"
      tabIndex={0}
      role="region"
      aria-label="Preview of the file"
    >
      <table className="text-caption" data-testid="import-preview">
        <thead className="sticky top-0 bg-sunken">
          <tr>
            <th className="px-2 py-1 text-left">row</th>
            {(table[0] ?? []).map((h, i) => (
              <th key={i} className="whitespace-nowrap px-2 py-1 text-left font-mono">
                {h}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {table.slice(1, PREVIEW_ROWS + 1).map((cells, r) => (
            <tr key={r} className="border-t border-line">
              <td className="figures px-2 py-1 text-ink-muted">{r + 2}</td>
              {cells.map((cell, c) => (
                <td
                  key={c}
                  className={
                    errorCells.has(`${r + 2}:${(table[0]?.[c] ?? '').trim().toLowerCase()}`)
                      ? 'bg-danger-soft px-2 py-1 font-semibold text-danger'
                      : 'px-2 py-1'
                  }
                >
                  {cell}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

export function ImportPanel({ data }: { data: SiteStrips }) {
  const { site } = data;
  const [file, setFile] = useState<File | null>(null);
  const [preview, setPreview] = useState<{ table: string[][]; parsed: ParsedImport } | null>(null);
  const upload = useImportCsv(site.siteId);
  const docs = useMemo(() => columnDocs(site.unitSystem), [site.unitSystem]);

  const choose = async (chosen: File | undefined) => {
    upload.reset();
    setFile(chosen ?? null);
    if (!chosen) return setPreview(null);
    const text = await chosen.text();
    const clean = text.replace(/^\uFEFF/, '');
    const table = Papa.parse<string[]>(clean, {
      skipEmptyLines: 'greedy',
      delimiter: csvDelimiter(clean),
    }).data;
    const parsed = parseImportCsv(text, {
      unitSystem: site.unitSystem,
      fieldName: site.fieldName,
      strips: data.strips,
    });
    setPreview({ table, parsed });
  };

  const serverErrors = isApiError(upload.error, 422) ? upload.error.rows : [];

  return (
    <div className="space-y-5">
      <Card className="space-y-3">
        <h2 className="text-heading text-ink">1. Get the template</h2>
        <p className="text-label text-ink-muted">
          One row per strip, with site, plot, block, position and rate filled in and every number
          already saved: the same file is the site’s export, so you can edit it in a spreadsheet and
          upload it back. Units follow the trial ({site.unitSystem}). An empty cell leaves the saved
          value as it is. Decimals may be written 12.5 or 12,5; files saved with semicolons (as
          spreadsheets set to a decimal comma do) are read too.
        </p>
        <a className={buttonClasses('secondary')} href={templateUrl(site.siteId)} download>
          Download CSV template
        </a>
        <details className="text-label">
          <summary className="cursor-pointer font-semibold text-accent">
            What each column means
          </summary>
          <dl className="mt-2 grid gap-x-4 gap-y-1 sm:grid-cols-[auto_1fr]">
            {docs.map((d) => (
              <div key={d.header} className="contents">
                <dt className="font-mono text-caption text-ink">{d.header}</dt>
                <dd className="text-caption text-ink-muted">{d.meaning}</dd>
              </div>
            ))}
          </dl>
        </details>
      </Card>

      <Card className="space-y-3">
        <h2 className="text-heading text-ink">2. Choose your filled-in file</h2>
        <label htmlFor="csv-file" className="text-label text-ink">
          CSV file (up to 5 MB)
        </label>
        <input
          id="csv-file"
          type="file"
          accept=".csv,text/csv"
          disabled={!site.canEdit}
          onChange={(event) => void choose(event.target.files?.[0])}
          className="block w-full text-label file:mr-3 file:min-h-11 file:rounded-field file:border file:border-line-strong file:bg-surface file:px-4 file:font-semibold"
        />
        {preview ? (
          <>
            {preview.parsed.errors.length > 0 ? (
              <Alert
                tone="danger"
                title={`${plural(preview.parsed.errors.length, 'problem')} to fix before uploading`}
              >
                <RowErrors errors={preview.parsed.errors} />
              </Alert>
            ) : (
              <Alert
                tone="success"
                title={`${plural(preview.parsed.rows.length, 'strip row')} ready to upload`}
              />
            )}
            <PreviewTable table={preview.table} errors={preview.parsed.errors} />
          </>
        ) : null}
      </Card>

      <Card className="space-y-3">
        <h2 className="text-heading text-ink">3. Upload</h2>
        <p className="text-label text-ink-muted">
          All rows are saved together, or none if any row has a problem. Uploading the same file
          again changes nothing.
        </p>
        {upload.isSuccess ? (
          <Alert tone="success" title="Uploaded">
            {plural(upload.data.changedStrips, 'strip')} changed, {upload.data.unchangedStrips}{' '}
            already up to date.
          </Alert>
        ) : null}
        {upload.isError ? (
          <Alert tone="danger" title="Nothing was saved">
            {errorSummary(upload.error)}
            {serverErrors.length > 0 ? <RowErrors errors={serverErrors} /> : null}
          </Alert>
        ) : null}
        <Button
          onClick={() => file && upload.mutate(file)}
          busy={upload.isPending}
          disabled={!file || !site.canEdit || (preview?.parsed.errors.length ?? 0) > 0}
        >
          Upload {file ? file.name : 'file'}
        </Button>
      </Card>
    </div>
  );
}
