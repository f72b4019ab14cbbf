import { useState } from 'react';
import { ApiError, workOrderApi } from '../../lib/client/api';
import { CROSSING_STYLE_WORDS, ITEM_STATE_LABELS, type ItemState, type WorkOrder, type WorkOrderItem, type WorkOrderSheet } from '../../lib/schemas/work-order';
import WorkOrderMap from './WorkOrderMap';
import { MaterialsTable, ProgressBar, formatDay } from './work-order-parts';

type Props = {
  propertyId: number;
  sheet: WorkOrderSheet;
  /** Crew and above on a sent order: the state buttons show. */
  canMark: boolean;
  /** Opened through a contractor's link: read-only, no links into the app. */
  contractor?: boolean;
};

const MARKS: { state: ItemState; label: string }[] = [
  { state: 'started', label: 'Started' },
  { state: 'done', label: 'Done' },
  { state: 'blocked', label: 'Blocked' },
];

const STATE_BADGE: Record<ItemState, string> = {
  'not-started': 'bg-sand-100 text-bark-700 border-sand-300',
  started: 'bg-creek-500/10 text-creek-700 border-creek-500',
  done: 'bg-saltbush-100 text-saltbush-700 border-saltbush-500',
  blocked: 'bg-clay-100 text-clay-600 border-clay-600',
};

/**
 * The crew view of a work order, made for a phone: each fence line and crossing with large
 * Started / Done / Blocked buttons and a note, the map with the person's own position, the
 * materials and the cautions. Read-only for viewers, for drafts and through a contractor's link.
 */
export default function WorkOrderView({ propertyId, sheet, canMark, contractor = false }: Props) {
  const [order, setOrder] = useState<WorkOrder>(sheet.order);
  const live = order.status === 'sent' || order.status === 'done';
  const marking = canMark && live;
  return (
    <div className="mx-auto flex max-w-3xl flex-col gap-5 px-3 py-4 sm:px-4">
      <header className="flex flex-col gap-1">
        <p className="text-sm text-bark-500">
          {sheet.propertyName} · work order {order.id} · <span data-testid="order-status">{order.status}</span>
        </p>
        <h1 className="text-2xl font-bold">{order.title}</h1>
        <p className="text-sm text-bark-700">
          {order.assigneeName ? `For ${order.assigneeName}` : order.contractorEmail ? `For ${order.contractorEmail}` : 'Nobody assigned yet'}
          {order.targetDate ? ` · target ${formatDay(order.targetDate)}` : ''}
        </p>
        {order.notes && <p className="mt-1 whitespace-pre-line rounded-lg bg-white p-3">{order.notes}</p>}
        <ProgressBar progress={order.progress} />
        {!live && <p className="rounded-lg bg-sand-100 p-3 text-sm">This order is {order.status}: work is marked on it once it has been sent.</p>}
        {contractor && <p className="rounded-lg bg-sand-100 p-3 text-sm">A read-only copy of the order. Tell whoever sent it as you finish each part.</p>}
      </header>

      <section aria-labelledby="items-heading" className="flex flex-col gap-3">
        <h2 id="items-heading" className="text-lg font-bold">
          Fence lines and crossings
        </h2>
        <ul className="flex flex-col gap-3">
          {order.items.map((item) => (
            <ItemCard key={item.id} item={item} marking={marking} propertyId={propertyId} orderId={order.id} onChanged={setOrder} />
          ))}
        </ul>
      </section>

      <section aria-labelledby="map-heading" className="flex flex-col gap-2">
        <h2 id="map-heading" className="text-lg font-bold">
          Map
        </h2>
        <WorkOrderMap propertyName={sheet.propertyName} propertyExtentWgs84={sheet.propertyExtentWgs84} map={sheet.map} />
      </section>

      <section aria-labelledby="materials-heading" className="flex flex-col gap-2">
        <h2 id="materials-heading" className="text-lg font-bold">
          Materials
        </h2>
        <MaterialsTable materials={sheet.materials} />
      </section>

      <aside className="rounded-lg border-2 border-ochre-600 bg-sand-100 p-3 text-sm text-bark-900" aria-label="Safety cautions" data-testid="cautions">
        <p className="font-semibold">Safety first</p>
        <ul className="mt-1 list-disc space-y-1 pl-5">
          {sheet.cautions.map((caution) => (
            <li key={caution}>{caution}</li>
          ))}
        </ul>
      </aside>

      {!contractor && (
        <p className="flex flex-wrap gap-3">
          <a className="btn-quiet min-h-12" href={`/app/properties/${propertyId}/work-orders/${order.id}/print`}>
            Printable sheet
          </a>
          <a className="btn-quiet min-h-12" href={`/app/properties/${propertyId}/work-orders`}>
            All work orders
          </a>
        </p>
      )}
    </div>
  );
}

function ItemCard({ item, marking, propertyId, orderId, onChanged }: { item: WorkOrderItem; marking: boolean; propertyId: number; orderId: number; onChanged: (order: WorkOrder) => void }) {
  const [note, setNote] = useState(item.note);
  const [busy, setBusy] = useState(false);
  const [problem, setProblem] = useState<string | null>(null);
  const style = item.style ? CROSSING_STYLE_WORDS[item.style] : undefined;
  const mark = async (state: ItemState) => {
    setBusy(true);
    setProblem(null);
    try {
      const { workOrder } = await workOrderApi.setItemState(propertyId, orderId, item.id, { state, note });
      onChanged(workOrder);
    } catch (error) {
      setProblem(error instanceof ApiError ? (Object.values(error.fields)[0] ?? error.message) : 'The change could not be saved. Check the connection and try again.');
    } finally {
      setBusy(false);
    }
  };
  return (
    <li className="card flex flex-col gap-3 p-4" data-testid="work-item" data-state={item.state}>
      <div className="flex flex-wrap items-start justify-between gap-2">
        <div>
          <p className="font-semibold">{item.label}</p>
          {item.kind === 'fence-line' && <p className="text-sm text-bark-500">{Math.round(item.lengthM ?? 0)} m of fence · now {item.fenceStatus}</p>}
          {item.kind === 'crossing' && (
            <p className="text-sm text-bark-700" data-testid="crossing-style">
              {style ? (
                <>
                  <span className="font-semibold">{style.name}.</span> {style.build}
                </>
              ) : (
                'Not designed yet: ask before building.'
              )}
            </p>
          )}
        </div>
        <span className={`rounded-full border px-3 py-1 text-sm font-semibold ${STATE_BADGE[item.state]}`} data-testid="item-state">
          {ITEM_STATE_LABELS[item.state]}
        </span>
      </div>
      {item.note && !marking && <p className="text-sm">Note: {item.note}</p>}
      {item.stateAt && (
        <p className="text-xs text-bark-500">
          {ITEM_STATE_LABELS[item.state]} {item.stateByName ? `by ${item.stateByName} ` : ''}on {new Date(item.stateAt).toLocaleString('en-AU')}
        </p>
      )}
      {marking && (
        <>
          <div className="field">
            <label htmlFor={`note-${item.id}`}>Note (say what is in the way when blocked)</label>
            <input id={`note-${item.id}`} value={note} maxLength={1000} onChange={(event) => setNote(event.target.value)} />
          </div>
          <div className="grid grid-cols-3 gap-2" role="group" aria-label={`Mark ${item.label}`}>
            {MARKS.map((m) => (
              <button
                key={m.state}
                type="button"
                disabled={busy}
                aria-pressed={item.state === m.state}
                onClick={() => mark(m.state)}
                className={`min-h-14 rounded-xl border-2 text-base font-bold ${item.state === m.state ? 'border-bark-900 bg-bark-900 text-white' : 'border-sand-300 bg-white text-bark-900'}`}
              >
                {m.label}
              </button>
            ))}
          </div>
          {problem && (
            <p role="alert" className="alert-error">
              {problem}
            </p>
          )}
        </>
      )}
    </li>
  );
}
