import { useState, type SyntheticEvent } from 'react';
import { ApiError, workOrderApi } from '../../lib/client/api';
import { CROSSING_STYLE_WORDS, type WorkOrder, type WorkOrderChoices } from '../../lib/schemas/work-order';
import { summariseProgress } from '../../lib/work-orders/progress';
import { ProgressBar, formatDay } from './work-order-parts';

type Props = { propertyId: number; initialOrders: WorkOrder[]; choices: WorkOrderChoices; canManage: boolean };

const STATUS_WORDS: Record<WorkOrder['status'], string> = { draft: 'Draft', sent: 'Sent', done: 'Done', cancelled: 'Cancelled' };

/**
 * The property's work orders: the progress of all live orders together, each order with its
 * progress bar, and for owners and managers the form that makes a draft and the send button.
 */
export default function WorkOrdersPage({ propertyId, initialOrders, choices, canManage }: Props) {
  const [orders, setOrders] = useState(initialOrders);
  const [notice, setNotice] = useState<{ kind: 'ok' | 'error'; text: string } | null>(null);
  const reload = async () => setOrders((await workOrderApi.list(propertyId)).workOrders);
  const live = orders.filter((order) => order.status === 'sent' || order.status === 'done');
  const overall = summariseProgress(live.flatMap((order) => order.items.map((item) => item.state)));

  // The list is reloaded before the notice shows, so what the notice says is already on screen.
  const act = async (what: () => Promise<unknown>, ok: string) => {
    setNotice(null);
    let result: { kind: 'ok' | 'error'; text: string };
    try {
      await what();
      result = { kind: 'ok', text: ok };
    } catch (error) {
      result = { kind: 'error', text: error instanceof ApiError ? error.message : 'That did not work. Check the connection and try again.' };
    }
    await reload().catch(() => undefined);
    setNotice(result);
  };

  return (
    <div className="flex flex-col gap-6">
      <section className="card flex flex-col gap-2" aria-labelledby="summary-heading" data-testid="property-progress">
        <h2 id="summary-heading" className="text-lg font-bold">
          Work on this property
        </h2>
        <p className="text-sm text-bark-700">
          {(['draft', 'sent', 'done', 'cancelled'] as const).map((status) => `${orders.filter((o) => o.status === status).length} ${STATUS_WORDS[status].toLowerCase()}`).join(' · ')}
        </p>
        <ProgressBar progress={overall} label="Work done on sent orders" />
      </section>

      {notice && (
        <p role={notice.kind === 'error' ? 'alert' : 'status'} className={notice.kind === 'error' ? 'alert-error' : 'rounded-lg bg-saltbush-100 p-3'} data-testid="notice">
          {notice.text}
        </p>
      )}

      <section aria-labelledby="orders-heading" className="flex flex-col gap-3">
        <h2 id="orders-heading" className="text-lg font-bold">
          Work orders
        </h2>
        {orders.length === 0 && <p>No work orders yet.{canManage ? ' Make one below from the fence lines and crossings to build.' : ''}</p>}
        <ul className="flex flex-col gap-3">
          {orders.map((order) => (
            <li key={order.id} className="card flex flex-col gap-2" data-testid="work-order-row">
              <div className="flex flex-wrap items-baseline justify-between gap-2">
                <a href={`/app/properties/${propertyId}/work-orders/${order.id}`} className="text-lg font-semibold">
                  {order.title}
                </a>
                <span className="rounded-full bg-sand-200 px-3 py-0.5 text-sm font-semibold" data-testid="order-status">
                  {STATUS_WORDS[order.status]}
                </span>
              </div>
              <p className="text-sm text-bark-700">
                {order.items.length} item{order.items.length === 1 ? '' : 's'} · {order.assigneeName ?? order.contractorEmail ?? 'nobody assigned'}
                {order.targetDate ? ` · target ${formatDay(order.targetDate)}` : ''}
                {order.sentAt ? ` · sent ${formatDay(order.sentAt)}` : ''}
              </p>
              <ProgressBar progress={order.progress} label={`Work done on ${order.title}`} />
              {canManage && (order.status === 'draft' || order.status === 'sent') && (
                <div className="flex flex-wrap gap-2">
                  <button
                    type="button"
                    className="btn-primary min-h-11"
                    onClick={() => act(() => workOrderApi.send(propertyId, order.id, order.version), `"${order.title}" was sent to ${order.contractorEmail ?? order.assigneeName}.`)}
                  >
                    {order.status === 'draft' ? 'Send' : 'Send again'}
                  </button>
                  <button
                    type="button"
                    className="btn-quiet min-h-11"
                    onClick={() => act(() => workOrderApi.update(propertyId, order.id, { version: order.version, status: 'cancelled' }), `"${order.title}" was cancelled.`)}
                  >
                    Cancel order
                  </button>
                  {order.link && !order.link.revoked && (
                    <button
                      type="button"
                      className="btn-quiet min-h-11"
                      onClick={() => act(() => workOrderApi.update(propertyId, order.id, { version: order.version, revokeLink: true }), 'The contractor link was withdrawn.')}
                    >
                      Withdraw contractor link
                    </button>
                  )}
                </div>
              )}
              {canManage && (order.status === 'draft' || order.status === 'cancelled') && (
                <div>
                  <button type="button" className="btn-quiet min-h-11" onClick={() => act(() => workOrderApi.remove(propertyId, order.id), `"${order.title}" was deleted.`)}>
                    Delete
                  </button>
                </div>
              )}
            </li>
          ))}
        </ul>
      </section>

      {canManage && <CreateForm propertyId={propertyId} choices={choices} onCreated={(order) => act(async () => order, `"${order.title}" was saved as a draft. Send it when it is ready.`)} />}
    </div>
  );
}

function CreateForm({ propertyId, choices, onCreated }: { propertyId: number; choices: WorkOrderChoices; onCreated: (order: WorkOrder) => void }) {
  const [fields, setFields] = useState<Record<string, string>>({});
  const [problem, setProblem] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const [who, setWho] = useState('');

  const submit = async (event: SyntheticEvent<HTMLFormElement>) => {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    const assignee = String(form.get('assignee') ?? '');
    setBusy(true);
    setFields({});
    setProblem(null);
    try {
      const { workOrder } = await workOrderApi.create(propertyId, {
        title: String(form.get('title') ?? ''),
        notes: String(form.get('notes') ?? ''),
        assigneeUserId: /^\d+$/.test(assignee) ? Number(assignee) : null,
        contractorEmail: assignee === 'contractor' ? String(form.get('contractorEmail') ?? '') : null,
        targetDate: String(form.get('targetDate') ?? '') || null,
        fenceLineIds: form.getAll('fenceLineIds').map(Number),
        crossingIds: form.getAll('crossingIds').map(Number),
      });
      (event.target as HTMLFormElement).reset();
      setWho('');
      onCreated(workOrder);
    } catch (error) {
      if (error instanceof ApiError) {
        setFields(error.fields);
        setProblem(error.message);
      } else setProblem('The order could not be saved. Check the connection and try again.');
    } finally {
      setBusy(false);
    }
  };
  const error = (name: string) =>
    fields[name] ? (
      <p className="field-error" id={`${name}-error`}>
        {fields[name]}
      </p>
    ) : null;

  return (
    <section className="card" aria-labelledby="create-heading">
      <h2 id="create-heading" className="text-lg font-bold">
        New work order
      </h2>
      <form className="mt-3 flex flex-col gap-4" onSubmit={submit} noValidate data-testid="create-work-order">
        <div className="field">
          <label htmlFor="wo-title">Title</label>
          <input id="wo-title" name="title" required maxLength={120} aria-invalid={Boolean(fields.title)} />
          {error('title')}
        </div>
        <div className="grid gap-4 sm:grid-cols-2">
          <div className="field">
            <label htmlFor="wo-assignee">Who does the work</label>
            <select id="wo-assignee" name="assignee" value={who} onChange={(event) => setWho(event.target.value)} aria-invalid={Boolean(fields.assigneeUserId)}>
              <option value="">Choose later</option>
              {choices.people.map((person) => (
                <option key={person.userId} value={person.userId}>
                  {person.name} ({person.role})
                </option>
              ))}
              <option value="contractor">An outside contractor (by e-mail)</option>
            </select>
            {error('assigneeUserId')}
          </div>
          <div className="field">
            <label htmlFor="wo-target">Target date</label>
            <input id="wo-target" name="targetDate" type="date" aria-invalid={Boolean(fields.targetDate)} />
            {error('targetDate')}
          </div>
        </div>
        {who === 'contractor' && (
          <div className="field">
            <label htmlFor="wo-contractor">Contractor's e-mail</label>
            <input id="wo-contractor" name="contractorEmail" type="email" autoComplete="off" aria-invalid={Boolean(fields.contractorEmail)} />
            {error('contractorEmail')}
          </div>
        )}
        <div className="field">
          <label htmlFor="wo-notes">Notes for the crew</label>
          <textarea id="wo-notes" name="notes" rows={3} maxLength={4000} className="rounded-lg border border-sand-300 bg-white px-3 py-2" />
          {error('notes')}
        </div>
        <fieldset className="flex flex-col gap-1">
          <legend className="text-sm font-semibold text-bark-700">Fence lines</legend>
          {choices.fenceLines.length === 0 && <p className="text-sm">No fence lines to build.</p>}
          <div className="flex max-h-60 flex-col gap-1 overflow-y-auto">
            {choices.fenceLines.map((fence) => (
              <label key={fence.id} className="flex min-h-11 items-center gap-3">
                <input type="checkbox" name="fenceLineIds" value={fence.id} className="size-5" />
                <span>
                  {fence.label} <span className="text-sm text-bark-500">· {Math.round(fence.lengthM)} m · {fence.status}</span>
                </span>
              </label>
            ))}
          </div>
          {error('fenceLineIds')}
        </fieldset>
        <fieldset className="flex flex-col gap-1">
          <legend className="text-sm font-semibold text-bark-700">Crossings</legend>
          {choices.crossings.length === 0 && <p className="text-sm">No crossings found yet.</p>}
          <div className="flex max-h-60 flex-col gap-1 overflow-y-auto">
            {choices.crossings.map((crossing) => (
              <label key={crossing.id} className="flex min-h-11 items-center gap-3">
                <input type="checkbox" name="crossingIds" value={crossing.id} className="size-5" />
                <span>
                  Crossing {crossing.label}{' '}
                  <span className="text-sm text-bark-500">· {crossing.style ? CROSSING_STYLE_WORDS[crossing.style]?.name ?? crossing.style : 'not designed'}</span>
                </span>
              </label>
            ))}
          </div>
          {error('crossingIds')}
        </fieldset>
        {problem && (
          <p role="alert" className="alert-error">
            {problem}
          </p>
        )}
        <div>
          <button type="submit" className="btn-primary min-h-12" disabled={busy}>
            Save as draft
          </button>
        </div>
      </form>
    </section>
  );
}
