import { useState } from 'react';
import { parsePriceListCsv, type PriceCsvResult } from '../../lib/schemas/price-list-csv';
import type { PriceListItem } from '../../lib/schemas/price-list';
import { formatAud } from './price-draft';

const MAX_FILE_BYTES = 1_000_000;

type Props = {
  disabled: boolean;
  onApply: (items: PriceListItem[], mode: 'merge' | 'replace') => void;
};

/** Reads a CSV price list, shows every row and its problems, and applies it only when all rows are sound. */
export function PriceImport({ disabled, onApply }: Props) {
  const [preview, setPreview] = useState<{
    name: string;
    result: PriceCsvResult;
  } | null>(null);
  const [mode, setMode] = useState<'merge' | 'replace'>('merge');

  const read = async (file: File | undefined) => {
    if (!file) return;
    if (file.size > MAX_FILE_BYTES)
      return setPreview({
        name: file.name,
        result: {
          ok: false,
          error: 'The file is larger than 1 MB; a price list is much smaller. Check it is the right file.',
        },
      });
    setPreview({
      name: file.name,
      result: parsePriceListCsv(await file.text()),
    });
  };

  const result = preview?.result;
  const bad = result?.ok ? result.rows.filter((r) => r.problems.length > 0).length : 0;
  const items = result?.ok && bad === 0 ? result.rows.map((r) => r.item!) : null;

  return (
    // `contents`: the button sits in the heading's row and the preview takes a full row under it.
    <div className="contents" data-testid="price-import">
      <label className="btn-quiet cursor-pointer">
        Import CSV…
        <input
          type="file"
          accept=".csv,text/csv"
          className="sr-only"
          data-testid="price-import-file"
          disabled={disabled}
          onChange={(e) => {
            void read(e.target.files?.[0]);
            e.target.value = '';
          }}
        />
      </label>
      {preview && (
        <div className="mt-2 basis-full rounded-lg border border-sand-300 bg-sand-50 p-4" data-testid="import-preview">
          <h3 className="font-bold">Importing {preview.name}</h3>
          {result && !result.ok ? (
            <p className="alert-error mt-2" role="alert">
              {result.error} Nothing has changed.
            </p>
          ) : result?.ok ? (
            <>
              <p className="mt-1 text-sm text-bark-700">
                {result.rows.length} item{result.rows.length === 1 ? '' : 's'} read
                {bad > 0 ? (
                  <strong className="text-clay-600">
                    {' '}
                    · {bad} row{bad === 1 ? ' needs' : 's need'} fixing in the file before it can be applied. Nothing has changed.
                  </strong>
                ) : (
                  '.'
                )}
                {result.ignoredColumns.length > 0 && ` Columns left out: ${result.ignoredColumns.join(', ')}.`}
              </p>
              <div className="mt-2 max-h-72 overflow-auto">
                <table className="w-full border-collapse text-left text-sm">
                  <thead>
                    <tr className="border-b border-sand-300 text-bark-500">
                      <th className="py-1 pr-2">Row</th>
                      <th className="py-1 pr-2">Item</th>
                      <th className="py-1 pr-2">Unit</th>
                      <th className="py-1 pr-2 text-right">Price</th>
                      <th className="py-1">Problems</th>
                    </tr>
                  </thead>
                  <tbody>
                    {result.rows.map((row) => (
                      <tr key={row.row} className={`border-b border-sand-200 align-top ${row.problems.length ? 'bg-clay-100' : ''}`} data-testid="import-row">
                        <td className="py-1 pr-2 tabular-nums">{row.row}</td>
                        <td className="py-1 pr-2">{[row.raw.code || '(no id)', row.raw.description || '(no name)'].join(' · ')}</td>
                        <td className="py-1 pr-2">{row.item?.unit ?? row.raw.unit}</td>
                        <td className="py-1 pr-2 text-right tabular-nums">{row.item ? formatAud(row.item.unitPriceCents) : row.raw.price}</td>
                        <td className="py-1 text-clay-600" data-testid="import-problem">
                          {row.problems.join(' ')}
                        </td>
                      </tr>
                    ))}
                  </tbody>
                </table>
              </div>
              <fieldset className="mt-3 flex flex-wrap gap-x-5 gap-y-1 text-sm">
                <legend className="sr-only">How to apply the file</legend>
                <label className="flex min-h-10 items-center gap-2">
                  <input type="radio" name="import-mode" checked={mode === 'merge'} onChange={() => setMode('merge')} />
                  Merge: update matching items, add new ones, keep the rest
                </label>
                <label className="flex min-h-10 items-center gap-2">
                  <input type="radio" name="import-mode" checked={mode === 'replace'} onChange={() => setMode('replace')} />
                  Replace the whole list with the file
                </label>
              </fieldset>
            </>
          ) : null}
          <div className="mt-3 flex flex-wrap gap-2">
            <button
              type="button"
              className="btn-primary"
              disabled={!items || disabled}
              onClick={() => {
                onApply(items!, mode);
                setPreview(null);
              }}
            >
              Apply and save
            </button>
            <button type="button" className="btn-quiet" onClick={() => setPreview(null)}>
              Cancel
            </button>
          </div>
        </div>
      )}
    </div>
  );
}
