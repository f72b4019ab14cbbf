import { createColumnHelper, flexRender, getCoreRowModel, getSortedRowModel, useReactTable, type SortingState } from '@tanstack/react-table';
import { useMemo, useState } from 'react';
import { PRICE_UNITS, type PriceUnit } from '../../lib/schemas/price-list';
import type { DraftRow } from './price-draft';

type Editable = 'code' | 'description' | 'unit' | 'price' | 'supplierNote';
/** The server's field name for each column (its errors are keyed `priceList.<index>.<field>`). */
const SERVER_FIELD: Record<Editable, string> = {
  code: 'code',
  description: 'description',
  unit: 'unit',
  price: 'unitPriceCents',
  supplierNote: 'supplierNote',
};
const LABELS: Record<Editable, string> = {
  code: 'Item id',
  description: 'Name',
  unit: 'Unit',
  price: 'Unit price (AUD)',
  supplierNote: 'Supplier note',
};

type Props = {
  rows: DraftRow[];
  canEdit: boolean;
  errors: Record<string, string>;
  onChange: (key: string, field: Editable, value: string) => void;
  onRemove: (key: string) => void;
};

type Meta = Pick<Props, 'canEdit' | 'errors' | 'onChange' | 'onRemove'>;

const column = createColumnHelper<DraftRow>();

function EditableCell({ field, row, index, meta }: { field: Editable; row: DraftRow; index: number; meta: Meta }) {
  const error = meta.errors[`priceList.${index}.${SERVER_FIELD[field]}`];
  const value = row[field];
  if (!meta.canEdit) return <span>{field === 'price' ? `$${value}` : value}</span>;
  const id = `${row.key}-${field}`;
  const label = `${LABELS[field]}, row ${index + 1}`;
  const common = {
    id,
    'aria-label': label,
    'aria-invalid': error ? true : undefined,
    'aria-describedby': error ? `${id}-error` : undefined,
    className: `min-h-10 w-full rounded-md border bg-white px-2 ${error ? 'border-clay-600' : 'border-sand-300'}`,
  };
  return (
    <div className="flex flex-col gap-0.5">
      {field === 'unit' ? (
        <select {...common} value={value} onChange={(e) => meta.onChange(row.key, field, e.target.value as PriceUnit)}>
          {PRICE_UNITS.map((unit) => (
            <option key={unit}>{unit}</option>
          ))}
        </select>
      ) : (
        <input
          {...common}
          value={value}
          inputMode={field === 'price' ? 'decimal' : undefined}
          className={`${common.className} ${field === 'price' ? 'text-right tabular-nums' : ''}`}
          onChange={(e) => meta.onChange(row.key, field, e.target.value)}
        />
      )}
      {error && (
        <span id={`${id}-error`} className="text-xs text-clay-600" data-testid="cell-error">
          {error}
        </span>
      )}
    </div>
  );
}

const editable = (field: Editable, size: string) =>
  column.accessor(field, {
    header: LABELS[field],
    meta: { size },
    sortingFn: field === 'price' ? (a, b) => Number(a.original.price) - Number(b.original.price) : 'alphanumeric',
    cell: (ctx) => <EditableCell field={field} row={ctx.row.original} index={ctx.row.index} meta={ctx.table.options.meta as Meta} />,
  });

/**
 * The price list as a sortable table; editors change cells in place, add and remove rows. On a
 * phone each row is a card of labelled fields instead, so nothing hides past the screen's edge.
 */
export function PriceListTable({ rows, canEdit, errors, onChange, onRemove }: Props) {
  const [sorting, setSorting] = useState<SortingState>([]);
  const columns = useMemo(
    () => [
      editable('code', 'min-w-40'),
      editable('description', 'min-w-56'),
      editable('unit', 'w-24'),
      editable('price', 'w-32'),
      editable('supplierNote', 'min-w-40'),
      ...(canEdit
        ? [
            column.display({
              id: 'remove',
              header: () => <span className="sr-only">Remove</span>,
              cell: (ctx) => (
                <button
                  type="button"
                  className="btn-quiet min-h-10 px-3"
                  aria-label={`Remove row ${ctx.row.index + 1}`}
                  onClick={() => (ctx.table.options.meta as Meta).onRemove(ctx.row.original.key)}
                >
                  Remove
                </button>
              ),
            }),
          ]
        : []),
    ],
    [canEdit],
  );
  const table = useReactTable({
    data: rows,
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    getRowId: (row) => row.key,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    meta: { canEdit, errors, onChange, onRemove } satisfies Meta,
  });

  return (
    <div className="sm:overflow-x-auto">
      <table className="w-full border-collapse text-left max-sm:block" data-testid="price-list-table">
        <thead className="max-sm:sr-only">
          {table.getHeaderGroups().map((group) => (
            <tr key={group.id} className="border-b border-sand-300 text-sm text-bark-500">
              {group.headers.map((header) => {
                const sorted = header.column.getIsSorted();
                const size = (header.column.columnDef.meta as { size?: string } | undefined)?.size ?? '';
                return (
                  <th key={header.id} className={`py-2 pr-2 font-semibold ${size}`} aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : undefined}>
                    {header.column.getCanSort() ? (
                      <button type="button" className="inline-flex min-h-10 items-center gap-1 font-semibold hover:text-bark-900" onClick={header.column.getToggleSortingHandler()}>
                        {flexRender(header.column.columnDef.header, header.getContext())}
                        <span aria-hidden="true">{sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : '↕'}</span>
                      </button>
                    ) : (
                      flexRender(header.column.columnDef.header, header.getContext())
                    )}
                  </th>
                );
              })}
            </tr>
          ))}
        </thead>
        <tbody className="max-sm:flex max-sm:flex-col max-sm:gap-3">
          {table.getRowModel().rows.map((row) => (
            <tr key={row.id} className="border-b border-sand-200 align-top max-sm:block max-sm:rounded-lg max-sm:border max-sm:p-3" data-testid="price-row">
              {row.getVisibleCells().map((cell) => {
                const header = cell.column.columnDef.header;
                return (
                  <td
                    key={cell.id}
                    data-label={typeof header === 'string' ? header : undefined}
                    className="py-1.5 pr-2 max-sm:block max-sm:pr-0 max-sm:before:mb-0.5 max-sm:before:block max-sm:before:text-sm max-sm:before:font-semibold max-sm:before:text-bark-700 max-sm:before:content-[attr(data-label)]"
                  >
                    {flexRender(cell.column.columnDef.cell, cell.getContext())}
                  </td>
                );
              })}
            </tr>
          ))}
          {rows.length === 0 && (
            <tr className="max-sm:block">
              <td colSpan={columns.length} className="py-4 text-bark-500 max-sm:block">
                The price list is empty: costs show as unpriced until items are added.
              </td>
            </tr>
          )}
        </tbody>
      </table>
    </div>
  );
}
