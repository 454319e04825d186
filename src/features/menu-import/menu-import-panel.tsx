// Menu import and export for the owner: choose a CSV → see every row as the import would take it,
// bad rows marked → import (only when nothing is wrong) → what it did. Also the menu's photos.
import { useId, useState, type ChangeEvent } from 'react';
import { Button, buttonStyles } from '@/components/ui/button';
import { FieldError } from '@/components/ui/field-error';
import { importSummary, MENU_CSV_COLUMNS, MENU_CSV_HELP, MENU_CSV_MAX_BYTES, type MenuImportPreview } from '@/domain/menu-csv';
import { cn } from '@/lib/cn';
import { FOCUS_RING } from './item-photo-upload';
import { ItemPhotos } from './item-photos';
import { PreviewTable } from './preview-table';
import { MENU_EXPORT_HREF, useImportMenu, usePreviewImport, type ChosenFile } from '@/queries/menu-import';

function PreviewSummary({ preview }: { preview: MenuImportPreview }) {
  const badRows = new Set(preview.errors.map((e) => e.row)).size;
  const { rows, added, updated, unchanged } = preview.counts;
  if (badRows > 0) {
    return (
      <p className="text-lg" role="alert" data-testid="import-problems">
        <span className="font-semibold text-copper-700">⚠ {badRows === 1 ? '1 row has a problem' : `${badRows} rows have problems`}.</span> Nothing can be
        imported until every row is right: fix {preview.fileName} and choose it again.
      </p>
    );
  }
  return (
    <p className="text-lg" data-testid="import-ready">
      {preview.fileName}: {rows} {rows === 1 ? 'row' : 'rows'} — {added} to add, {updated} to update, {unchanged} unchanged.
    </p>
  );
}

/** Problems the table can't show beside a row: the column names, or rows that didn't come out. */
function FileProblems({ preview }: { preview: MenuImportPreview }) {
  const shown = new Set(preview.rows.map((r) => r.row));
  const others = preview.errors.filter((e) => !shown.has(e.row));
  if (others.length === 0) return null;
  return (
    <ul className="space-y-1 rounded-lg border-l-4 border-copper-700 bg-steam-100 p-3 text-base" data-testid="file-problems">
      {others.map((e, i) => (
        <li key={i}>
          <span className="font-semibold">
            ⚠ Row {e.row}
            {e.column ? `, ${e.column}` : ''}:
          </span>{' '}
          {e.message}
        </li>
      ))}
    </ul>
  );
}

export function MenuImportPanel() {
  const inputId = useId();
  const preview = usePreviewImport();
  const importer = useImportMenu();
  const [file, setFile] = useState<ChosenFile | null>(null);
  const [localError, setLocalError] = useState<string | undefined>();

  async function choose(e: ChangeEvent<HTMLInputElement>) {
    const picked = e.target.files?.[0];
    e.target.value = ''; // so the same file, fixed and saved, can be chosen again
    if (!picked) return;
    preview.reset();
    importer.reset();
    setLocalError(undefined);
    if (picked.size > MENU_CSV_MAX_BYTES) return setLocalError(`${picked.name} is larger than 256 KB; a menu file is much smaller. Is it the right file?`);
    // read once: the import sends exactly the bytes the preview showed, even if the file changes on disk
    const chosen = { name: picked.name, bytes: new Blob([await picked.arrayBuffer()], { type: picked.type || 'text/csv' }) };
    setFile(chosen);
    preview.mutate(chosen);
  }

  const result = preview.data;
  const canImport = result && result.errors.length === 0 && result.rows.length > 0 && !importer.isSuccess;
  const importDetails = (importer.error as { details?: { row?: number; column?: string | null; message: string }[] } | null)?.details;

  return (
    <section aria-labelledby="menu-import-heading" className="space-y-4 rounded-xl border border-steam-200 bg-white p-5 text-ink-900">
      <div className="flex flex-wrap items-center gap-3">
        <h2 id="menu-import-heading" className="mr-auto text-2xl font-semibold">
          Import and export
        </h2>
        <a href={MENU_EXPORT_HREF} download className={buttonStyles({ tone: 'quiet' })} data-testid="menu-export">
          Download the menu as CSV
        </a>
      </div>
      <p className="max-w-4xl text-base">
        One row per item size. Rows are matched to the menu by category, item and size name (capitals don't matter): a match is updated, anything else is added.{' '}
        <strong>Nothing is deleted</strong> — items and sizes that are not in the file stay on the menu as they are. The whole file is imported, or none of it.
      </p>
      <details className="text-base">
        <summary className="min-h-11 cursor-pointer py-2 font-semibold">The columns</summary>
        <dl className="grid grid-cols-[max-content_1fr] gap-x-4 gap-y-1 pl-4">
          {MENU_CSV_COLUMNS.map((c) => (
            <div key={c} className="contents">
              <dt className="font-mono text-sm leading-6">{c}</dt>
              <dd>{MENU_CSV_HELP[c]}</dd>
            </div>
          ))}
        </dl>
      </details>

      <div className="flex flex-wrap items-center gap-3">
        <input id={inputId} type="file" accept=".csv,text/csv" aria-label="Menu CSV file" className="peer sr-only" onChange={choose} />
        <label htmlFor={inputId} className={cn(buttonStyles({ tone: 'primary', size: 'lg' }), FOCUS_RING, 'cursor-pointer')}>
          Choose a CSV file…
        </label>
        {file && <span className="text-base text-ink-600">{file.name}</span>}
        {preview.isPending && <span className="text-base">Reading the file…</span>}
      </div>
      <FieldError message={localError ?? preview.error?.message} />

      {result && !importer.isSuccess && (
        <div className="space-y-3">
          <PreviewSummary preview={result} />
          <FileProblems preview={result} />
          {result.rows.length > 0 && <PreviewTable preview={result} />}
          {canImport && (
            <Button size="lg" disabled={importer.isPending} onClick={() => file && importer.mutate(file)}>
              {importer.isPending ? 'Importing…' : `Import ${result.rows.length} ${result.rows.length === 1 ? 'row' : 'rows'}`}
            </Button>
          )}
          {importer.error && (
            <div role="alert" className="text-base">
              <p className="font-semibold text-copper-700">⚠ {importer.error.message}</p>
              {importDetails && (
                <ul className="list-disc pl-6">
                  {importDetails.map((d, i) => (
                    <li key={i}>
                      {d.row ? `Row ${d.row}${d.column ? `, ${d.column}` : ''}: ` : ''}
                      {d.message}
                    </li>
                  ))}
                </ul>
              )}
            </div>
          )}
        </div>
      )}
      {importer.data && (
        <p role="status" className="rounded-lg border-l-4 border-copper-500 bg-steam-100 p-3 text-lg" data-testid="import-result">
          <span className="font-semibold">✓ Imported. {importSummary(importer.data)}.</span> The Counter and the Bar have the new menu now.
        </p>
      )}

      <details className="border-t border-steam-200 pt-3">
        <summary className="min-h-11 cursor-pointer py-2 text-xl font-semibold">Item photos</summary>
        <div className="pt-2">
          <ItemPhotos />
        </div>
      </details>
    </section>
  );
}
