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

      <div className="@container mt-3">
        <div className="grid grid-cols-1 gap-3 @md:grid-cols-2">
          {comparison.sides.map((side) => (
            <StyleCard
              key={side.style}
              side={side}
              recommended={side.style === recommendation.style}
              canChoose={canEdit && !side.inPlan}
              busy={choose.isPending}
              onChoose={() => {
                setMessage(null);
                choose.mutate(side.style);
              }}
            />
          ))}
        </div>
      </div>
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

function StyleCard({ side, recommended, canChoose, busy, onChoose }: { side: StyleSideView; recommended: boolean; canChoose: boolean; busy: boolean; onChoose: () => void }) {
  const c = side.counts;
  const rows: [string, string][] = [
    ['End assemblies', String(c.endAssemblies)],
    ['Flex-run strainers', c.flexRunStrainers ? `${c.flexRunStrainers}, ${formatMetres(side.flexRunEachSideM, 0)} each side` : 'none'],
    ['Wires', side.wiresRunThrough ? 'run through' : 'end on both banks'],
    ['Posts · stays', `${c.posts} · ${c.stays}`],
    ['Hung · other droppers', `${c.hungDroppers} · ${c.droppers}`],
    ['Breakaway ties', String(c.breakawayTies)],
    ['Flood load, each end assembly', formatValue(side.endAssemblyLoadKn, 2, 'kN')],
  ];
  return (
    <article
      className={`rounded-lg border p-3 text-sm ${side.inPlan ? 'border-2 border-creek-700 bg-sand-50' : 'border-sand-300 bg-sand-100'}`}
      aria-label={STYLE_LABEL[side.style]}
      data-testid={`style-${side.style}`}
    >
      <h4 className="font-bold text-bark-900">{STYLE_LABEL[side.style]}</h4>
      <p className="mt-1 flex flex-wrap gap-1">
        {side.inPlan && <span className="rounded bg-creek-700 px-2 py-0.5 text-xs font-semibold text-white">In the plan</span>}
        {recommended && <span className="rounded bg-saltbush-700 px-2 py-0.5 text-xs font-semibold text-white">Recommended</span>}
      </p>
      <dl className="mt-2 grid grid-cols-[1fr_auto] gap-x-3 gap-y-1">
        {rows.map(([label, value]) => (
          <div key={label} className="contents">
            <dt className="text-bark-700">{label}</dt>
            <dd className="text-right tabular-nums">{value}</dd>
          </div>
        ))}
        <dt className="text-bark-700">Cost to build</dt>
        <dd className="text-right font-semibold tabular-nums">{side.cost ? dollars(side.cost.totalCents) : '—'}</dd>
      </dl>
      {side.cost && (
        <p className="mt-1 text-xs text-bark-700">
          Materials {dollars(side.cost.materialsCents)} + labour {dollars(side.cost.labourCents)} ({formatValue(side.cost.labourDays, 1, 'days')})
          {side.cost.complete ? '' : `; ${side.cost.unpriced.length} item${side.cost.unpriced.length === 1 ? '' : 's'} without a price, not counted`}.
        </p>
      )}
      <p className="mt-2 font-semibold text-bark-900">After a flood</p>
      <p>
        {side.afterFlood.work}: about {hours(side.afterFlood.hours)}.
      </p>
      <Why reasons={[side.endAssemblyLoadReason, side.afterFlood.reason, ...side.strengths.map((s) => `For: ${s}`), ...side.weaknesses.map((w) => `Against: ${w}`)]} />
      {canChoose && (
        <button type="button" className="btn-primary mt-2 w-full" disabled={busy} onClick={onChoose}>
          Build it this way instead
        </button>
      )}
    </article>
  );
}
