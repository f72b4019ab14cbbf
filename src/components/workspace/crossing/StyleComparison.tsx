import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { api } from '../../../lib/client/api';
import type { CrossingDetailView, CrossingStyle, StyleComparisonView, StyleSideView } from '../../../lib/schemas/crossing-view';
import { crossingDetailQuery } from './crossing-detail-query';
import { formatMetres, formatValue } from './format';
import { STYLE_LABEL } from './labels';
import { Section } from './Section';
import { Why } from './Why';

type Props = {
  propertyId: number;
  crossing: CrossingDetailView;
  comparison: StyleComparisonView;
  /** Managers and owners may choose the other style; viewers and crew read it. */
  canEdit: boolean;
};

const money = new Intl.NumberFormat('en-AU', { style: 'currency', currency: 'AUD', maximumFractionDigits: 0 });
const dollars = (cents: number) => money.format(cents / 100);
const hours = (h: number) => `${formatValue(h, h % 1 === 0 ? 0 : 1, '')} person-hour${h === 1 ? '' : 's'}`;

/** Both ways to build the crossing side by side, the recommendation, and (for managers) a way to pick the other. */
export function StyleComparison({ propertyId, crossing, comparison, canEdit }: Props) {
  const queryClient = useQueryClient();
  const [message, setMessage] = useState<string | null>(null);
  const choose = useMutation({
    mutationFn: (style: CrossingStyle) => api.setCrossingInputs(propertyId, crossing.id, { style }).then((answer) => answer.crossing),
    onSuccess: (redesigned) => {
      queryClient.setQueryData(crossingDetailQuery(propertyId, crossing.id, crossing.computedAt).queryKey, redesigned);
      queryClient.setQueryData(crossingDetailQuery(propertyId, crossing.id, redesigned.computedAt).queryKey, redesigned);
      void queryClient.invalidateQueries({ queryKey: ['crossings', propertyId] });
      setMessage(`Designed again as a ${STYLE_LABEL[redesigned.style ?? comparison.inPlan].toLowerCase()}; materials and exports follow it.`);
    },
  });
  const { recommendation } = comparison;
  const agrees = recommendation.style === comparison.inPlan;

  return (
    <Section title="Two ways to build it">
      <div className="mt-2 rounded-lg border border-saltbush-500 bg-saltbush-100 p-3 text-sm" data-testid="style-recommendation">
        <p>
          <span className="font-semibold">Recommended: {STYLE_LABEL[recommendation.style].toLowerCase()}.</span>{' '}
          In the plan now: <span className="font-semibold">{STYLE_LABEL[comparison.inPlan].toLowerCase()}</span>{' '}
          ({comparison.chosenBy === 'planner' ? 'chosen by the planner' : 'the default rule’s choice'}
          {agrees ? '' : ', not the recommended one'}).
        </p>
        <ul className="mt-1 list-disc space-y-1 pl-5 text-bark-700">
          {recommendation.reasons.map((reason) => (
            <li key={reason}>{reason}</li>
          ))}
        </ul>
        <Why summary="Where the rule comes from" reasons={[comparison.basis]} />
      </div>

      <ComparisonTable
        sides={comparison.sides}
        recommended={recommendation.style}
        canEdit={canEdit}
        busy={choose.isPending}
        onChoose={(style) => {
          setMessage(null);
          choose.mutate(style);
        }}
      />
      {choose.isPending && <p className="mt-2 text-sm text-bark-700" role="status">Designing the crossing again…</p>}
      {message && <p className="mt-2 text-sm text-saltbush-700" role="status">{message}</p>}
      {choose.error && (
        <p className="alert-error mt-2 text-sm" role="alert">
          The style could not be changed: {choose.error.message}
        </p>
      )}
      <p className="mt-2 text-sm text-bark-700">
        After-flood work is done only once the water has gone down (see Safety below). {comparison.stretchReason}
      </p>

      {comparison.release && (
        <div className="mt-3 text-sm">
          <p className="font-semibold text-bark-900">When the drop-down section lets go</p>
          <ul className="mt-1 list-disc space-y-1 pl-5 text-bark-700">
            {comparison.release.reasons.map((reason) => (
              <li key={reason}>{reason}</li>
            ))}
          </ul>
          <Why summary="Method and sources" reasons={[comparison.release.method]} />
        </div>
      )}
    </Section>
  );
}

type TableProps = { sides: readonly StyleSideView[]; recommended: CrossingStyle; canEdit: boolean; busy: boolean; onChoose: (style: CrossingStyle) => void };

/** The two styles in two columns, one row per measure, so each figure sits beside its twin. */
function ComparisonTable({ sides, recommended, canEdit, busy, onChoose }: TableProps) {
  const rows: [string, (side: StyleSideView) => string][] = [
    ['End assemblies', (s) => String(s.counts.endAssemblies)],
    ['Flex-run strainers', (s) => (s.counts.flexRunStrainers ? `${s.counts.flexRunStrainers}, runs of ${formatMetres(s.flexRunEachSideM, 0)}` : 'none')],
    ['Wires', (s) => (s.wiresRunThrough ? 'run through' : 'end on both banks')],
    ['Posts', (s) => String(s.counts.posts)],
    ['Stays', (s) => String(s.counts.stays)],
    ['Hung droppers', (s) => String(s.counts.hungDroppers)],
    ['Other droppers', (s) => String(s.counts.droppers)],
    ['Breakaway ties', (s) => String(s.counts.breakawayTies)],
    ['Flood load on each end assembly', (s) => formatValue(s.endAssemblyLoadKn, 2, 'kN')],
  ];
  return (
    <div className="mt-3 overflow-x-auto">
      <table className="w-full table-fixed text-left text-sm" data-testid="style-comparison">
        <caption className="sr-only">The continuous floodgate and the drop-down section compared</caption>
        <thead>
          <tr className="align-bottom">
            <th className="w-[34%] py-1 pr-2" scope="col">
              <span className="sr-only">Measure</span>
            </th>
            {sides.map((side) => (
              <th key={side.style} scope="col" className={`px-2 py-1 font-bold text-bark-900 ${side.inPlan ? 'bg-sand-100' : ''}`} data-testid={`style-${side.style}`}>
                {STYLE_LABEL[side.style]}
                <span className="mt-1 flex flex-wrap gap-1 font-semibold">
                  {side.inPlan && <span className="rounded bg-creek-700 px-1.5 py-0.5 text-xs text-white">In the plan</span>}
                  {side.style === recommended && <span className="rounded bg-saltbush-700 px-1.5 py-0.5 text-xs text-white">Recommended</span>}
                </span>
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {rows.map(([label, value]) => (
            <tr key={label} className="border-t border-sand-200 align-top">
              <th scope="row" className="py-1.5 pr-2 font-normal text-bark-700">{label}</th>
              {sides.map((side) => (
                <td key={side.style} className={`px-2 py-1.5 tabular-nums ${side.inPlan ? 'bg-sand-100' : ''}`}>{value(side)}</td>
              ))}
            </tr>
          ))}
          <tr className="border-t border-sand-300 align-top">
            <th scope="row" className="py-1.5 pr-2 font-semibold text-bark-900">Cost to build</th>
            {sides.map((side) => (
              <td key={side.style} className={`px-2 py-1.5 ${side.inPlan ? 'bg-sand-100' : ''}`}>
                <span className="font-semibold tabular-nums">{side.cost ? dollars(side.cost.totalCents) : '—'}</span>
                {side.cost && (
                  <span className="block text-xs text-bark-700">
                    materials {dollars(side.cost.materialsCents)}, labour {dollars(side.cost.labourCents)}
                    {side.cost.complete ? '' : `; ${side.cost.unpriced.length} item${side.cost.unpriced.length === 1 ? '' : 's'} not priced`}
                  </span>
                )}
              </td>
            ))}
          </tr>
          <tr className="border-t border-sand-200 align-top">
            <th scope="row" className="py-1.5 pr-2 font-semibold text-bark-900">After a flood</th>
            {sides.map((side) => (
              <td key={side.style} className={`px-2 py-1.5 ${side.inPlan ? 'bg-sand-100' : ''}`}>
                {side.afterFlood.work}: <span className="font-semibold">about {hours(side.afterFlood.hours)}</span>
              </td>
            ))}
          </tr>
          <tr className="align-top">
            <td />
            {sides.map((side) => (
              <td key={side.style} className={`px-2 pb-2 ${side.inPlan ? 'bg-sand-100' : ''}`}>
                <Why reasons={[side.endAssemblyLoadReason, side.afterFlood.reason, ...side.strengths.map((x) => `For: ${x}`), ...side.weaknesses.map((x) => `Against: ${x}`)]} />
                {canEdit && !side.inPlan && (
                  <button type="button" className="btn-primary mt-1 w-full" disabled={busy} onClick={() => onChoose(side.style)}>
                    Build it this way
                  </button>
                )}
              </td>
            ))}
          </tr>
        </tbody>
      </table>
    </div>
  );
}
