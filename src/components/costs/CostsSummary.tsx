import type { CostsView } from '../../lib/schemas/costs-view';
import { crossingStyleName } from '../../lib/schemas/crossing';
import { formatAud } from './price-draft';

const km = (m: number) => `${(m / 1000).toFixed(2)} km`;

/** The property's cost, then each fence line's and each designed crossing's. */
export function CostsSummary({ costs, propertyId }: { costs: CostsView; propertyId: number }) {
  const { totals } = costs;
  const unpriced = [...new Set(costs.fenceLines.flatMap((f) => f.priced.unpriced.map((u) => u.item.code)))];
  return (
    <div className="space-y-5">
      <dl className="grid grid-cols-2 gap-3 sm:grid-cols-4">
        <div className="col-span-2 rounded-lg bg-saltbush-100 p-3 sm:col-span-1">
          <dt className="text-sm text-saltbush-700">Property total</dt>
          <dd className="text-2xl font-bold tabular-nums" data-testid="property-total">
            {formatAud(totals.totalCents)}
          </dd>
        </div>
        <div className="rounded-lg bg-sand-100 p-3">
          <dt className="text-sm text-bark-500">Materials</dt>
          <dd className="text-lg font-semibold tabular-nums">{formatAud(totals.materialsCents)}</dd>
        </div>
        <div className="rounded-lg bg-sand-100 p-3">
          <dt className="text-sm text-bark-500">Labour ({totals.labourDays.toFixed(1)} crew days)</dt>
          <dd className="text-lg font-semibold tabular-nums">{formatAud(totals.labourCents)}</dd>
        </div>
        <div className="col-span-2 rounded-lg bg-sand-100 p-3 sm:col-span-1">
          <dt className="text-sm text-bark-500">Fence</dt>
          <dd className="text-lg font-semibold tabular-nums">
            {km(totals.lengthM)} · {costs.crossings.length} crossing
            {costs.crossings.length === 1 ? '' : 's'}
          </dd>
        </div>
      </dl>
      {!totals.complete && (
        <p className="rounded-lg border border-ochre-500 bg-sand-100 px-4 py-3 text-bark-900" data-testid="costs-incomplete">
          Part of the cost only: the price list has no price for {unpriced.join(', ')}. Add {unpriced.length === 1 ? 'it' : 'them'} below for a whole figure.
        </p>
      )}
      <p>
        <a href={`/api/properties/${propertyId}/materials.csv`} download>
          Download the materials list (CSV)
        </a>
      </p>

      <div>
        <h3 className="mb-2 font-bold">Fence lines</h3>
        {costs.fenceLines.length === 0 ? (
          <p className="text-bark-500">No fence lines yet: draw them on the map.</p>
        ) : (
          <>
            <ul className="divide-y divide-sand-200 border-y border-sand-200 sm:hidden">
              {costs.fenceLines.map((f) => (
                <li key={f.fenceLineId} className="py-2">
                  <div className="flex justify-between gap-3 font-semibold">
                    <span>{f.name}</span>
                    <span className="tabular-nums">
                      {formatAud(f.priced.totalCents)}
                      {!f.priced.complete && ' *'}
                    </span>
                  </div>
                  <div className="text-sm text-bark-500">
                    {f.status} · {km(f.lengthM)} · {f.crossings} crossing
                    {f.crossings === 1 ? '' : 's'} · materials {formatAud(f.priced.materialsCents)} · labour {formatAud(f.priced.labour.costCents)}
                  </div>
                </li>
              ))}
            </ul>
            <div className="hidden overflow-x-auto sm:block">
              <table className="w-full border-collapse text-left text-sm" data-testid="fence-costs">
                <thead>
                  <tr className="border-b border-sand-300 text-bark-500">
                    <th className="py-2 pr-3 font-semibold">Fence line</th>
                    <th className="py-2 pr-3 text-right font-semibold">Length</th>
                    <th className="py-2 pr-3 text-right font-semibold">Crossings</th>
                    <th className="py-2 pr-3 text-right font-semibold">Materials</th>
                    <th className="py-2 pr-3 text-right font-semibold">Labour</th>
                    <th className="py-2 text-right font-semibold">Total</th>
                  </tr>
                </thead>
                <tbody>
                  {costs.fenceLines.map((f) => (
                    <tr key={f.fenceLineId} className="border-b border-sand-200">
                      <td className="py-2 pr-3">
                        {f.name} <span className="text-bark-500">({f.status})</span>
                      </td>
                      <td className="py-2 pr-3 text-right tabular-nums">{km(f.lengthM)}</td>
                      <td className="py-2 pr-3 text-right tabular-nums">{f.crossings}</td>
                      <td className="py-2 pr-3 text-right tabular-nums">{formatAud(f.priced.materialsCents)}</td>
                      <td className="py-2 pr-3 text-right tabular-nums">{formatAud(f.priced.labour.costCents)}</td>
                      <td className="py-2 text-right font-semibold tabular-nums">
                        {formatAud(f.priced.totalCents)}
                        {!f.priced.complete && <span title="Some items have no price"> *</span>}
                      </td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          </>
        )}
      </div>

      <div>
        <h3 className="mb-1 font-bold">Crossings</h3>
        <p className="mb-2 text-sm text-bark-500">Each crossing's floodgate on its own, in the chosen style. These are part of the fence line totals above, not added to them.</p>
        {costs.crossings.length === 0 ? (
          <p className="text-bark-500">No designed crossings yet.</p>
        ) : (
          <>
            <ul className="divide-y divide-sand-200 border-y border-sand-200 sm:hidden">
              {costs.crossings.map((c) => (
                <li key={c.crossingId} className="py-2">
                  <div className="flex justify-between gap-3 font-semibold">
                    <span>
                      {c.fenceName} at {Math.round(c.chainageM)} m
                    </span>
                    <span className="tabular-nums">
                      {formatAud(c.totalCents)}
                      {!c.complete && ' *'}
                    </span>
                  </div>
                  <div className="text-sm text-bark-500">
                    {c.style ? crossingStyleName(c.style) : 'style not set'} · materials {formatAud(c.materialsCents)} · labour {formatAud(c.labourCents)}
                  </div>
                </li>
              ))}
            </ul>
            <div className="hidden overflow-x-auto sm:block">
              <table className="w-full border-collapse text-left text-sm" data-testid="crossing-costs">
                <thead>
                  <tr className="border-b border-sand-300 text-bark-500">
                    <th className="py-2 pr-3 font-semibold">Crossing</th>
                    <th className="py-2 pr-3 font-semibold">Style</th>
                    <th className="py-2 pr-3 text-right font-semibold">Materials</th>
                    <th className="py-2 pr-3 text-right font-semibold">Labour</th>
                    <th className="py-2 text-right font-semibold">Total</th>
                  </tr>
                </thead>
                <tbody>
                  {costs.crossings.map((c) => (
                    <tr key={c.crossingId} className="border-b border-sand-200">
                      <td className="py-2 pr-3">
                        {c.fenceName} at {Math.round(c.chainageM)} m
                      </td>
                      <td className="py-2 pr-3">{c.style ? crossingStyleName(c.style) : '—'}</td>
                      <td className="py-2 pr-3 text-right tabular-nums">{formatAud(c.materialsCents)}</td>
                      <td className="py-2 pr-3 text-right tabular-nums">{formatAud(c.labourCents)}</td>
                      <td className="py-2 text-right font-semibold tabular-nums">
                        {formatAud(c.totalCents)}
                        {!c.complete && <span title="Some items have no price"> *</span>}
                      </td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          </>
        )}
      </div>
    </div>
  );
}
