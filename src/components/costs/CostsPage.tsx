import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import { ApiError, api } from '../../lib/client/api';
import { applyImportedPrices, parseDollars, priceListToCsv } from '../../lib/schemas/price-list-csv';
import type { PriceListItem } from '../../lib/schemas/price-list';
import type { SettingsView } from '../../lib/schemas/costs-view';
import { withQueryClient } from '../QueryRoot';
import { CostsSummary } from './CostsSummary';
import { PriceImport } from './PriceImport';
import { PriceListTable } from './PriceListTable';
import { blankRow, fromDraft, toDraft, type DraftRow } from './price-draft';

type Props = { propertyId: number; propertyName: string; canEdit: boolean };
type Draft = {
  rows: DraftRow[];
  ratePerDay: string;
  metresPerDay: string;
  version: number;
};

function draftOf(view: SettingsView): Draft {
  const design = { ...view.defaults, ...view.settings.designSettings };
  return {
    rows: toDraft(view.settings.priceList),
    ratePerDay: (design.labourRatePerDayCents / 100).toFixed(2),
    metresPerDay: String(design.metresPerDay),
    version: view.settings.version,
  };
}

function download(name: string, text: string) {
  const url = URL.createObjectURL(new Blob([text], { type: 'text/csv;charset=utf-8' }));
  const link = Object.assign(document.createElement('a'), {
    href: url,
    download: name,
  });
  link.click();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}

/** The Costs page: what the plan costs, and the price list and labour rates it is priced from. */
function CostsPage({ propertyId, propertyName, canEdit }: Props) {
  const queryClient = useQueryClient();
  const settings = useQuery({
    queryKey: ['settings', propertyId],
    queryFn: () => api.getSettings(propertyId),
  });
  const costs = useQuery({
    queryKey: ['costs', propertyId],
    queryFn: () => api.getCosts(propertyId).then((r) => r.costs),
  });
  const [draft, setDraft] = useState<Draft | null>(null);
  const [dirty, setDirty] = useState(false);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [notice, setNotice] = useState<{
    kind: 'error' | 'conflict' | 'saved';
    text: string;
  } | null>(null);

  // The draft follows the server until someone edits it; then it stays until saved or discarded.
  useEffect(() => {
    if (settings.data && !dirty) setDraft(draftOf(settings.data));
  }, [settings.data, dirty]);

  const save = useMutation({
    mutationFn: (next: Draft) => {
      const { items, problems } = fromDraft(next.rows);
      const rate = parseDollars(next.ratePerDay);
      const metres = Number(next.metresPerDay);
      if ('problem' in rate) problems['designSettings.labourRatePerDayCents'] = rate.problem.replace('unit price', 'day rate');
      if (!(metres > 0) || !Number.isFinite(metres)) problems['designSettings.metresPerDay'] = 'Metres a day is a number above 0.';
      if (Object.keys(problems).length > 0) throw new ApiError(422, 'Some fields need attention.', problems);
      const designSettings = {
        ...settings.data?.settings.designSettings,
        labourRatePerDayCents: 'cents' in rate ? rate.cents : 0,
        metresPerDay: metres,
      };
      return api.updateSettings(propertyId, {
        version: next.version,
        priceList: items,
        designSettings,
      });
    },
    onSuccess: ({ settings: saved }) => {
      queryClient.setQueryData<SettingsView>(['settings', propertyId], (old) => (old ? { ...old, settings: { ...old.settings, ...saved } } : old));
      setErrors({});
      setDirty(false);
      setNotice({
        kind: 'saved',
        text: 'Saved. The costs above use the new prices.',
      });
      void queryClient.invalidateQueries({ queryKey: ['costs', propertyId] });
    },
    onError: (error) => {
      if (error instanceof ApiError && error.status === 409) setNotice({ kind: 'conflict', text: error.message });
      else
        setNotice({
          kind: 'error',
          text: error instanceof ApiError ? error.message : 'The price list could not be saved. Check your connection and try again.',
        });
      setErrors(error instanceof ApiError ? error.fields : {});
    },
  });

  const edit = (change: (d: Draft) => Draft) => {
    setDraft((d) => (d ? change(d) : d));
    setDirty(true);
    setNotice((n) => (n?.kind === 'saved' ? null : n));
  };
  const loadTheirs = async () => {
    const fresh = await settings.refetch();
    if (!fresh.data) return;
    setDraft(draftOf(fresh.data));
    setDirty(false);
    setErrors({});
    setNotice(null);
  };
  const applyImport = (items: PriceListItem[], mode: 'merge' | 'replace') => {
    if (!draft) return;
    // Merged into the table as it stands, so unsaved edits of rows the file does not mention are kept.
    const next = {
      ...draft,
      rows: applyImportedPrices(draft.rows, toDraft(items), mode),
    };
    edit(() => next);
    save.mutate(next);
  };

  if (settings.isError || costs.isError) return <p className="alert-error">The costs could not be loaded. Reload the page to try again.</p>;

  return (
    <div className="space-y-8">
      <section className="card" aria-labelledby="costs-heading">
        <h2 id="costs-heading" className="mb-4 text-xl font-bold">
          What the plan costs
        </h2>
        {costs.data ? <CostsSummary costs={costs.data} propertyId={propertyId} /> : <p className="text-bark-500">Working out the costs…</p>}
      </section>

      <section className="card" aria-labelledby="prices-heading">
        <div className="mb-3 flex flex-wrap items-center gap-2">
          <h2 id="prices-heading" className="mr-auto text-xl font-bold">
            Price list
          </h2>
          <button
            type="button"
            className="btn-quiet"
            disabled={!settings.data}
            onClick={() => settings.data && download(`price-list-${propertyName.toLowerCase().replace(/[^a-z0-9]+/g, '-')}.csv`, priceListToCsv(settings.data.settings.priceList))}
          >
            Download CSV
          </button>
          {canEdit && <PriceImport disabled={!draft || save.isPending} onApply={applyImport} />}
        </div>
        <p className="mb-3 text-sm text-bark-500">
          Prices in Australian dollars, as you pay them. The item id is the code the materials list uses; an item can be priced in more than one unit (wire by the roll or by the
          metre).
          {!canEdit && ' Owners and managers change prices.'}
        </p>
        {notice && (
          <div
            className={notice.kind === 'saved' ? 'mb-3 rounded-lg bg-saltbush-100 px-4 py-3 text-saltbush-700' : 'alert-error mb-3'}
            role={notice.kind === 'saved' ? 'status' : 'alert'}
            data-testid="save-notice"
          >
            {notice.text}
            {notice.kind === 'conflict' && (
              <span className="mt-2 flex flex-wrap items-center gap-2">
                <span className="text-bark-700">Your edits are still in the table.</span>
                <button type="button" className="btn-quiet" onClick={() => void loadTheirs()}>
                  Load theirs
                </button>
              </span>
            )}
          </div>
        )}
        {draft ? (
          <>
            <PriceListTable
              rows={draft.rows}
              canEdit={canEdit}
              errors={errors}
              onChange={(key, field, value) =>
                edit((d) => ({
                  ...d,
                  rows: d.rows.map((r) => (r.key === key ? { ...r, [field]: value } : r)),
                }))
              }
              onRemove={(key) =>
                edit((d) => ({
                  ...d,
                  rows: d.rows.filter((r) => r.key !== key),
                }))
              }
            />
            {errors.priceList && <p className="field-error mt-2">{errors.priceList}</p>}
            <fieldset className="mt-5 grid gap-4 sm:grid-cols-2" disabled={!canEdit}>
              <legend className="mb-2 font-bold">Labour</legend>
              <div className="field">
                <label htmlFor="labour-rate">Crew day rate (AUD)</label>
                <input
                  id="labour-rate"
                  inputMode="decimal"
                  value={draft.ratePerDay}
                  aria-invalid={errors['designSettings.labourRatePerDayCents'] ? true : undefined}
                  onChange={(e) => edit((d) => ({ ...d, ratePerDay: e.target.value }))}
                />
                {errors['designSettings.labourRatePerDayCents'] && <span className="field-error">{errors['designSettings.labourRatePerDayCents']}</span>}
              </div>
              <div className="field">
                <label htmlFor="metres-per-day">Metres of fence a crew builds in a day</label>
                <input
                  id="metres-per-day"
                  inputMode="decimal"
                  value={draft.metresPerDay}
                  aria-invalid={errors['designSettings.metresPerDay'] ? true : undefined}
                  onChange={(e) => edit((d) => ({ ...d, metresPerDay: e.target.value }))}
                />
                {errors['designSettings.metresPerDay'] && <span className="field-error">{errors['designSettings.metresPerDay']}</span>}
              </div>
              <p className="text-sm text-bark-500 sm:col-span-2">
                Defaults ({settings.data && `$${(settings.data.defaults.labourRatePerDayCents / 100).toFixed(0)} a day, ${settings.data.defaults.metresPerDay} m a day`}) are common
                practice, not from a published source: set your own crew&apos;s figures.
              </p>
            </fieldset>
            {canEdit && (
              <div className="mt-4 flex flex-wrap gap-2">
                <button type="button" className="btn-quiet" onClick={() => edit((d) => ({ ...d, rows: [...d.rows, blankRow()] }))}>
                  Add row
                </button>
                <button type="button" className="btn-primary" disabled={!dirty || save.isPending} onClick={() => draft && save.mutate(draft)}>
                  {save.isPending ? 'Saving…' : 'Save price list'}
                </button>
                {dirty && <span className="self-center text-sm text-bark-500">Unsaved changes</span>}
              </div>
            )}
          </>
        ) : (
          <p className="text-bark-500">Loading the price list…</p>
        )}
      </section>
    </div>
  );
}

export default withQueryClient(CostsPage);
