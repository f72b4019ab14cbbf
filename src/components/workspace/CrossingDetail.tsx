import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useEffect, useId, useRef, useState, type ReactNode, type SyntheticEvent } from 'react';
import { ApiError, api } from '../../lib/client/api';
import { crossingInputsSchema } from '../../lib/schemas/crossing';
import type {
  CrossingDetailView,
  CrossingDesignView,
  CrossingFloodsView,
  CrossingInputsChange,
  CrossingStyle,
  CrossingSummaryView,
  DesignedCrossingView,
  LonLat,
} from '../../lib/schemas/crossing-view';
import type { FenceLine } from '../../lib/schemas/plan';
import { PLAN_COLOURS } from '../map/plan-layers';
import { ANGLE_CLASS_LABEL, AngleBadge, DESIGN_STATUS_LABEL, formatArea, formatChainage, formatValue } from './CrossingsPanel';

/** The usual cautions (DESIGN.md, Safety), shown when a stored design carries none. */
const STANDARD_CAUTIONS = [
  'Never enter floodwater, to inspect, clear or re-tie a crossing: wait until the water has gone down.',
  'Locate buried services (pipes, cables) before digging or drilling post holes.',
  'Wear eye and hand protection when straining wire, welding or grinding; strained wire that breaks can whip.',
  'Local codes, permits for works in watercourses, and licensed practice take precedence over this tool.',
];

const STYLE_LABEL: Record<CrossingStyle, string> = {
  'continuous-floodgate': 'Continuous floodgate',
  'drop-down-section': 'Drop-down section',
};

/** A suggested square crossing being previewed on the map. */
export type RealignmentPreview = {
  crossingId: number;
  fenceLineId: number;
  fenceVersion: number;
  coordinates: LonLat[];
  addedLengthM: number;
  newAngleDeg: number;
  replacedChainageRange: { fromM: number; toM: number };
};

/**
 * The query of one crossing's full design. `computedAt` is part of the key, so a crossing designed
 * again (new inputs, new terrain, a moved fence) is fetched again when the list shows the change.
 */
export function crossingDetailQuery(propertyId: number, crossingId: number, computedAt: string | null) {
  return queryOptions({
    queryKey: ['crossing', propertyId, crossingId, computedAt ?? ''] as const,
    queryFn: () => api.getCrossing(propertyId, crossingId).then((answer) => answer.crossing),
  });
}

const isDesigned = (design: CrossingDesignView | null | undefined): design is DesignedCrossingView => design?.status === 'designed';

type Props = {
  propertyId: number;
  summary: CrossingSummaryView;
  canEdit: boolean;
  onClose: () => void;
  onShowOnMap: () => void;
  realignment: RealignmentPreview | null;
  onRealignmentChange: (preview: RealignmentPreview | null) => void;
  /** The suggestion was accepted and the fence line has its new shape. */
  onRealigned: (fenceLine: FenceLine) => Promise<void>;
  /** Bumped to bring the detail into view (and focus its heading); 0 leaves the page where it is. */
  revealSeq: number;
  /** What just happened to this crossing (a realignment accepted), in a sentence. */
  notice: string | null;
};

/** One crossing: its angle, catchment, design floods, floodgate layout with reasons, checks, materials and cautions. */
export default function CrossingDetail({ propertyId, summary, canEdit, onClose, onShowOnMap, realignment, onRealignmentChange, onRealigned, revealSeq, notice }: Props) {
  const query = useQuery(crossingDetailQuery(propertyId, summary.id, summary.computedAt));
  const crossing = query.data;
  const design = crossing?.design ?? null;
  const sectionRef = useRef<HTMLElement>(null);
  const headingRef = useRef<HTMLHeadingElement>(null);
  const formRef = useRef<HTMLFormElement>(null);
  // Inputs change the flood and the layout; they cannot make a channel where the ground shows none.
  const canChangeInputs = canEdit && (crossing?.designStatus === 'designed' || crossing?.designStatus === 'needs-input');
  const editInputs = canChangeInputs
    ? () => {
        formRef.current?.scrollIntoView({ block: 'start', behavior: 'smooth' });
        formRef.current?.querySelector('input')?.focus({ preventScroll: true });
      }
    : undefined;

  useEffect(() => {
    if (!revealSeq) return;
    const reduceMotion = window.matchMedia('(prefers-reduced-motion: reduce)').matches;
    sectionRef.current?.scrollIntoView({ block: 'start', behavior: reduceMotion ? 'auto' : 'smooth' });
    headingRef.current?.focus({ preventScroll: true });
  }, [revealSeq]);

  return (
    <section ref={sectionRef} className="card scroll-mt-2 p-4" aria-labelledby="crossing-detail-heading" data-testid="crossing-detail">
      <div className="flex items-start justify-between gap-2">
        <div>
          <h2 id="crossing-detail-heading" ref={headingRef} tabIndex={-1} className="font-bold focus:outline-none">
            Crossing on {summary.fenceName}
          </h2>
          <p className="text-sm text-bark-700">
            {formatChainage(summary.chainageM)} along the fence
            {summary.streamOrder !== null ? ` · stream order ${summary.streamOrder}` : ''}
          </p>
        </div>
        <button type="button" className="btn-quiet shrink-0 px-3" onClick={onClose}>
          Close
        </button>
      </div>

      <p role="status" className={notice ? 'mt-3 rounded-lg border border-saltbush-500 bg-saltbush-100 p-3 text-sm font-semibold text-bark-900' : 'sr-only'}>
        {notice}
      </p>
      <AngleSection summary={summary} />
      <button type="button" className="btn-quiet mt-3 w-full" onClick={onShowOnMap}>
        Show on the map
      </button>

      {(summary.angleClass === 'fair' || summary.angleClass === 'poor') && (summary.kind === 'crossing' || summary.kind === 'crosses-twice') && (
        <Realignment
          propertyId={propertyId}
          summary={summary}
          canEdit={canEdit}
          preview={realignment}
          onPreview={onRealignmentChange}
          onRealigned={onRealigned}
        />
      )}

      {query.isPending ? (
        <p className="mt-4 text-sm text-bark-700">Loading the design…</p>
      ) : query.error ? (
        <p className="alert-error mt-4 text-sm" role="alert">The design could not be loaded: {query.error.message}</p>
      ) : crossing ? (
        <>
          <KindNote crossing={crossing} />
          <CatchmentSection crossing={crossing} />
          {isDesigned(design) ? (
            <DesignSections design={design} onEditInputs={editInputs} />
          ) : design && 'problem' in design ? (
            <>
              <div className="mt-4 rounded-lg border border-ochre-600 bg-sand-100 p-3 text-sm" role="status">
                <p className="font-semibold">{DESIGN_STATUS_LABEL[crossing.designStatus] ?? 'Not designed'}</p>
                <Problem text={design.problem} />
                {design.status === 'needs-input' && !canEdit && <p className="mt-1">A manager or owner can enter a flood mark.</p>}
              </div>
              {design.floods && <FloodSection floods={design.floods} onEditInputs={editInputs} />}
            </>
          ) : null}
          {canChangeInputs && <InputsForm key={crossing.id} propertyId={propertyId} crossing={crossing} formRef={formRef} />}
        </>
      ) : null}

      <Cautions cautions={design?.cautions?.length ? design.cautions : STANDARD_CAUTIONS} />
    </section>
  );
}

// ---- small building blocks --------------------------------------------------------------------

function Section({ title, children }: { title: string; children: ReactNode }) {
  return (
    <section className="mt-5 border-t border-sand-200 pt-3">
      <h3 className="font-bold text-bark-900">{title}</h3>
      {children}
    </section>
  );
}

/** Label/value pairs in two columns. */
function Facts({ rows }: { rows: [string, ReactNode][] }) {
  return (
    <dl className="mt-2 grid grid-cols-[minmax(0,1fr)_auto] gap-x-3 gap-y-1 text-sm">
      {rows.map(([label, value]) => (
        <div key={label} className="contents">
          <dt className="text-bark-700">{label}</dt>
          <dd className="text-right font-semibold tabular-nums text-bark-900">{value}</dd>
        </div>
      ))}
    </dl>
  );
}

/** The reasons behind a figure, folded away until asked for. */
function Why({ reasons, summary = 'Why', children }: { reasons?: readonly string[]; summary?: string; children?: ReactNode }) {
  if (!children && (!reasons || reasons.length === 0)) return null;
  return (
    <details className="group mt-1 text-sm">
      <summary className="flex min-h-11 cursor-pointer items-center font-semibold text-creek-700">{summary}</summary>
      {reasons && reasons.length > 0 && (
        <ul className="mb-2 list-disc space-y-1 pl-5 text-bark-700">
          {reasons.map((reason, index) => (
            <li key={index}>{reason}</li>
          ))}
        </ul>
      )}
      {children}
    </details>
  );
}

/** Where the bracket that closes the text opens (brackets may nest inside it), or -1. */
function openingOfLastBracket(text: string): number {
  if (!text.endsWith(')')) return -1;
  let depth = 0;
  for (let i = text.length - 1; i >= 0; i -= 1) {
    if (text[i] === ')') depth += 1;
    else if (text[i] === '(' && --depth === 0) return text[i - 1] === ' ' ? i - 1 : -1;
  }
  return -1;
}

/** A design problem: the plain sentence first, a technical note in brackets at its end folded away. */
function Problem({ text }: { text: string }) {
  const at = openingOfLastBracket(text);
  if (at <= 0) return <p className="mt-1 break-words">{text}</p>;
  return (
    <>
      <p className="mt-1">{text.slice(0, at)}</p>
      <Why summary="Technical detail">
        <p className="mb-2 break-words text-bark-700">{text.slice(at + 2, -1)}</p>
      </Why>
    </>
  );
}

function Check({ ok, yes, no }: { ok: boolean; yes: string; no: string }) {
  return ok ? (
    <span className="font-semibold text-saltbush-700">✓ {yes}</span>
  ) : (
    <span className="font-semibold text-clay-600">✗ {no}</span>
  );
}

const m = (value: number | null | undefined, digits = 1) => formatValue(value, digits, 'm');
const kn = (newtons: number) => formatValue(newtons / 1000, 2, 'kN');

// ---- angle, kind, catchment -----------------------------------------------------------------

function AngleSection({ summary }: { summary: CrossingSummaryView }) {
  const { angleDeg, angleClass } = summary;
  return (
    <div className="mt-3 rounded-lg bg-sand-100 p-3">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <AngleBadge crossing={summary} />
        <span className="text-sm font-semibold text-bark-700">{DESIGN_STATUS_LABEL[summary.designStatus] ?? summary.designStatus}</span>
      </div>
      <p className="mt-2 text-sm text-bark-900" data-testid="crossing-angle">
        {angleDeg === null
          ? 'No crossing angle: the fence does not cross this drainage line.'
          : `Crosses the flow at ${Math.round(angleDeg)}°, ${Math.round(Math.abs(90 - angleDeg))}° off square: ${angleClass ? ANGLE_CLASS_LABEL[angleClass].toLowerCase() : 'unclassed'}.`}
      </p>
      <p className="mt-1 text-xs text-bark-700">90° is square to the flow, where a floodgate is shortest and floods do fences least harm.</p>
    </div>
  );
}

function KindNote({ crossing }: { crossing: CrossingDetailView }) {
  const design = crossing.design;
  if (crossing.kind === 'runs-along' && design && !('status' in design && design.status)) {
    const along = design as { fromChainageM?: number; toChainageM?: number; lengthM?: number };
    return (
      <p className="mt-4 rounded-lg border border-ochre-600 bg-sand-100 p-3 text-sm">
        The fence runs along this drainage line for {m(along.lengthM, 0)}
        {along.fromChainageM !== undefined && along.toChainageM !== undefined
          ? ` (from ${formatChainage(along.fromChainageM)} to ${formatChainage(along.toChainageM)} along the fence)`
          : ''}
        . A fence in a channel catches every flood: move it onto higher ground beside the channel, or cross the channel square.
      </p>
    );
  }
  if (crossing.kind === 'touch') {
    const reason = design && 'touchReason' in design ? design.touchReason : null;
    return <p className="mt-4 rounded-lg border border-sand-300 bg-sand-100 p-3 text-sm">The fence only touches this drainage line{reason ? `: ${reason}` : '.'}</p>;
  }
  if (crossing.kind === 'crosses-twice') {
    return (
      <p className="mt-4 rounded-lg border border-sand-300 bg-sand-100 p-3 text-sm">
        The fence crosses this drainage line more than once close together: a single square crossing is usually better.
      </p>
    );
  }
  if (crossing.designStatus === 'no-terrain') {
    return <p className="mt-4 text-sm text-bark-700">No processed elevation model lies under this part of the fence, so the crossing cannot be designed yet.</p>;
  }
  return null;
}

function CatchmentSection({ crossing }: { crossing: CrossingDetailView }) {
  const catchment = crossing.design?.catchment ?? null;
  if (!catchment && crossing.upstreamAreaHa === null) return null;
  return (
    <Section title="Catchment">
      <Facts
        rows={[
          ...(crossing.upstreamAreaHa !== null ? ([['Upstream area of the drainage line', formatArea(crossing.upstreamAreaHa)]] as [string, ReactNode][]) : []),
          ...(catchment
            ? ([
                ['Catchment traced to the crossing', formatArea(catchment.areaHa)],
                ['Longest flow path', catchment.longestFlowPathM >= 1000 ? formatValue(catchment.longestFlowPathM / 1000, 2, 'km') : m(catchment.longestFlowPathM, 0)],
                ['Equal-area slope', formatValue(catchment.equalAreaSlopeMPerKm, 1, 'm/km')],
              ] as [string, ReactNode][])
            : []),
        ]}
      />
    </Section>
  );
}

// ---- the design -----------------------------------------------------------------------------

function DesignSections({ design, onEditInputs }: { design: DesignedCrossingView; onEditInputs?: () => void }) {
  const { layout } = design;
  return (
    <>
      {design.provisional && (
        <p className="mt-4 rounded-lg border border-clay-600 bg-clay-100 p-3 text-sm text-bark-900" role="status">
          <strong>Provisional:</strong> the flood spreads past the ground known here, or an end strainer could not be proven to stand on dry ground. Check
          the place on foot, in dry weather, before building.
        </p>
      )}
      {design.profile && design.profile.length > 1 && <GroundProfile design={design} />}
      <FloodSection floods={design.floods} onEditInputs={onEditInputs} />
      <LayoutSection layout={layout} />
      {design.wireCheck && (
        <Section title="Wire check">
          <Facts
            rows={[
              ['Flex run each side', m(design.wireCheck.flexRunEachSideM, 0)],
              ['Set by', design.wireCheck.governedBy],
              ['Extra wire when pushed by the flood', m(design.wireCheck.extraLengthM, 3)],
              ['Tension rise', kn(design.wireCheck.tensionIncreaseN)],
              ['Wire tension, flood on it', kn(design.wireCheck.totalTensionN)],
              ['Allowed tension', kn(design.wireCheck.allowedTensionN)],
            ]}
          />
          <Why reasons={design.wireCheck.reasons} summary="Working and method">
            <p className="mb-2 text-bark-700">{design.wireCheck.method}</p>
          </Why>
        </Section>
      )}
      {design.loads && (
        <Section title="Flood loads">
          <Facts
            rows={[
              ['On the bare wires', formatValue(design.loads.bareWiresKn, 2, 'kN')],
              ['On a debris mat', formatValue(design.loads.debrisMatKn, 2, 'kN')],
              ['Total downstream', formatValue(design.loads.totalKn, 2, 'kN')],
              ['At each end strainer', formatValue(design.loads.eachEndStrainerKn, 2, 'kN')],
            ]}
          />
          <p className="mt-2 rounded-lg border border-ochre-600 bg-sand-100 p-2 text-sm font-semibold text-bark-900">{design.loads.caution}</p>
          <Why reasons={design.loads.reasons} summary="Working and method">
            <p className="mb-2 text-bark-700">{design.loads.method}</p>
          </Why>
        </Section>
      )}
      <MaterialsSection design={design} />
      {design.warnings.length > 0 && (
        <Section title="Warnings">
          <ul className="mt-2 flex flex-col gap-2 text-sm">
            {design.warnings.map((warning, index) => (
              <li key={index} className="rounded-lg border-l-4 border-ochre-600 bg-sand-100 px-3 py-2">
                {warning}
              </li>
            ))}
          </ul>
        </Section>
      )}
    </>
  );
}

function FloodSection({ floods, onEditInputs }: { floods: CrossingFloodsView; onEditInputs?: () => void }) {
  const rainfall = floods.fromRainfall;
  const mark = floods.fromMark;
  const discharge = floods.fromDischarge ?? null;
  return (
    <Section title="Design flood">
      <p className="mt-1 text-sm text-bark-700">
        Worked out two ways and both kept; an observed flood mark, where there is one, is the better guide.
      </p>
      <div className="mt-2 flex flex-col gap-2">
        <FloodMethod title="From a flood mark" chosen={floods.chosen === 'mark'}>
          {mark ? (
            <>
              <Facts
                rows={[
                  ['Flood level', m(mark.stageM, 2)],
                  ['Deepest water', m(mark.maxDepthM, 2)],
                  ['Flow it carries', formatValue(mark.dischargeM3s, 2, 'm³/s')],
                  ['Mean velocity', formatValue(mark.meanVelocityMs, 2, 'm/s')],
                ]}
              />
              <Why reasons={mark.warnings} summary="Method">
                <p className="mb-2 text-bark-700">{mark.method}</p>
              </Why>
            </>
          ) : (
            <p className="mt-1 text-sm text-bark-700">No flood mark entered. Measure the debris line after a flood, in metres above the channel bed.</p>
          )}
        </FloodMethod>
        <FloodMethod title="From rainfall (Rational method)" chosen={floods.chosen === 'rainfall'}>
          {rainfall ? (
            <>
              <Facts
                rows={[
                  ['Chance each year (AEP)', `${rainfall.flood.aepPercent} %`],
                  ['Storm duration (tc)', formatValue(rainfall.flood.tcMin, 0, 'min')],
                  ['Rain intensity', formatValue(rainfall.flood.intensityMmH, 1, 'mm/h')],
                  ['Peak flow', formatValue(rainfall.flood.dischargeM3s, 2, 'm³/s')],
                  ['Flood level', rainfall.level.overtopped ? 'over the profile' : m(rainfall.level.stageM, 2)],
                  ['Deepest water', m(rainfall.level.maxDepthM, 2)],
                  ['Mean velocity', formatValue(rainfall.level.meanVelocityMs, 2, 'm/s')],
                ]}
              />
              {rainfall.flood.caveats.map((caveat) => (
                <p key={caveat} className="mt-2 rounded-md bg-sand-100 p-2 text-sm text-bark-900">
                  {caveat}
                </p>
              ))}
              <Why reasons={[...rainfall.flood.warnings, ...rainfall.level.warnings]} summary="Method and sources">
                <p className="mb-2 text-bark-700">{rainfall.flood.method}</p>
                <p className="mb-2 text-bark-700">{rainfall.level.method}</p>
                <ul className="mb-2 list-disc pl-5 text-bark-700">
                  {rainfall.flood.sources.map((source) => (
                    <li key={source}>{source}</li>
                  ))}
                </ul>
              </Why>
            </>
          ) : (
            <p className="mt-1 text-sm text-bark-700">{floods.rainfallUnavailable ?? 'Not worked out.'}</p>
          )}
        </FloodMethod>
        {discharge && (
          <FloodMethod title="From a given flow" chosen={floods.chosen === 'discharge'}>
            <Facts
              rows={[
                ['Flow', formatValue(discharge.dischargeM3s, 2, 'm³/s')],
                ['Flood level', discharge.overtopped ? 'over the profile' : m(discharge.stageM, 2)],
                ['Deepest water', m(discharge.maxDepthM, 2)],
              ]}
            />
          </FloodMethod>
        )}
      </div>
      {floods.chosen && (
        <Facts
          rows={[
            ['Design flood level', m(floods.levelM, 2)],
            ['Deepest water', m(floods.maxDepthM, 2)],
            ['Mean velocity', formatValue(floods.meanVelocityMs, 2, 'm/s')],
            ['Width of water', m(floods.wettedWidthM, 1)],
          ]}
        />
      )}
      {onEditInputs && (
        <button type="button" className="btn-quiet mt-3 w-full" onClick={onEditInputs}>
          {floods.fromMark ? 'Change the flood mark or other inputs' : 'Enter a flood mark or change the inputs'}
        </button>
      )}
    </Section>
  );
}

function FloodMethod({ title, chosen, children }: { title: string; chosen: boolean; children: ReactNode }) {
  return (
    <div className={`rounded-lg border p-3 ${chosen ? 'border-2 border-creek-700 bg-white' : 'border-sand-300 bg-sand-50'}`}>
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h4 className="text-sm font-bold">{title}</h4>
        {chosen && <span className="rounded-md bg-creek-700 px-2 py-0.5 text-xs font-bold text-white">Used for the design</span>}
      </div>
      {children}
    </div>
  );
}

function LayoutSection({ layout }: { layout: DesignedCrossingView['layout'] }) {
  const floodgatePosts = layout.posts.filter((post) => post.role === 'floodgate');
  const stayed = layout.posts.filter((post) => post.braced);
  const open = layout.posts.filter((post) => post.hungDropper?.link === 'open').length;
  const closed = layout.posts.filter((post) => post.hungDropper?.link === 'closed').length;
  const plain = layout.wires.filter((wire) => wire.mustBePlain);
  const detail = layout.styleDetail;
  const wireName = (index: number) => `wire ${index + 1}`;
  return (
    <Section title={`Floodgate layout: ${STYLE_LABEL[layout.style] ?? layout.style}`}>
      <Facts
        rows={[
          ['Design flood level', m(layout.floodLevelM, 2)],
          ['With freeboard', m(layout.designLevelM, 2)],
          ['Wet zone', `${formatChainage(layout.wetZone.startChainageM)} – ${formatChainage(layout.wetZone.endChainageM)}`],
          ['Wet zone length', m(layout.wetZone.lengthM, 1)],
          ['Deepest water in it', m(layout.wetZone.maxDepthM, 2)],
          ['Floodgate length', m(layout.floodgate.lengthM, 1)],
        ]}
      />
      <Why reasons={[layout.floodgate.reason]} summary="Why the floodgate is this long" />

      <h4 className="mt-3 text-sm font-bold">End strainers</h4>
      <ul className="mt-1 flex flex-col gap-2">
        {layout.endStrainers.map((strainer) => (
          <li key={strainer.side} className="rounded-lg border border-sand-300 p-2 text-sm">
            <p className="flex flex-wrap justify-between gap-x-2">
              <span className="font-semibold">{strainer.side === 'start' ? 'Near side' : 'Far side'}, at {formatChainage(strainer.chainageM)}</span>
              <Check ok={strainer.onDryGround} yes="on dry ground" no="dry ground not proven" />
            </p>
            <p className="text-bark-700">{m(strainer.setbackFromWetZoneM, 0)} back from the wet zone{strainer.groundM !== null ? `, ground ${m(strainer.groundM, 2)}` : ''}</p>
            <Why reasons={[...strainer.reasons, ...strainer.warnings]} />
          </li>
        ))}
      </ul>

      <h4 className="mt-3 text-sm font-bold">Flex runs</h4>
      <p className="mt-1 text-sm">
        {detail.wiresRunThrough
          ? `${m(detail.flexRunEachSideM, 0)} of strained wire each side (rule of thumb at least ${m(detail.recommendedMinFlexRunM, 0)}); the wires run unbroken through the floodgate.`
          : 'None: the wires end at the end strainers and the drop-down section between them is light and sacrificial.'}
      </p>
      <Why reasons={detail.reasons} />

      <h4 className="mt-3 text-sm font-bold">Posts and droppers</h4>
      <Facts
        rows={[
          ['Posts between the end strainers', String(layout.posts.length)],
          ['In the floodgate (heavy)', String(floodgatePosts.length)],
          ['Stayed (deep or fast flow)', String(stayed.length)],
          ['Hung droppers, open link', String(open)],
          ['Hung droppers, closed link', String(closed)],
        ]}
      />
      <Why reasons={[layout.heavyPosts.reason]} summary="Every post, and why">
        <ul className="mb-2 list-disc space-y-1 pl-5 text-bark-700">
          {reasonsByPost(layout.posts).map(([reason, chainages]) => (
            <li key={reason}>
              {reason} <span className="text-bark-500">(at {chainages.map((chainageM) => formatChainage(chainageM)).join(', ')})</span>
            </li>
          ))}
        </ul>
        <div className="mb-2 overflow-x-auto">
          <table className="w-full text-left text-xs tabular-nums">
            <thead>
              <tr className="border-b border-sand-300 text-bark-700">
                <th className="py-1 pr-2 font-semibold">Along</th>
                <th className="py-1 pr-2 font-semibold">Post</th>
                <th className="py-1 pr-2 font-semibold">Water</th>
                <th className="py-1 font-semibold">Dropper link</th>
              </tr>
            </thead>
            <tbody>
              {layout.posts.map((post) => (
                <tr key={post.chainageM} className="border-b border-sand-200 align-top" title={post.reasons.join(' ')}>
                  <td className="py-1 pr-2">{formatChainage(post.chainageM)}</td>
                  <td className="py-1 pr-2">
                    {post.role === 'floodgate' ? 'floodgate' : 'line'}
                    {post.braced ? ', stayed' : ''}
                    {post.breakawayTie ? ', tie' : ''}
                  </td>
                  <td className="py-1 pr-2">{post.floodDepthM >= 0.005 ? `${m(post.floodDepthM, 2)}, ${formatValue(post.velocityMs, 1, 'm/s')}` : 'dry'}</td>
                  <td className="py-1">{post.hungDropper ? post.hungDropper.link : '—'}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </Why>

      <h4 className="mt-3 text-sm font-bold">Breakaway tie</h4>
      {layout.breakawayTies.length === 0 ? (
        <p className="mt-1 text-sm">None in this layout.</p>
      ) : (
        layout.breakawayTies.map((tie) => (
          <div key={tie.chainageM} className="text-sm">
            <p className="mt-1">
              At {formatChainage(tie.chainageM)}, {tie.at === 'lowest-post' ? 'on the lowest floodgate post' : 'hooking the section to an end assembly'}.
            </p>
            <Why reasons={[tie.reason]} />
          </div>
        ))
      )}

      <h4 className="mt-3 text-sm font-bold">Wires</h4>
      <p className="mt-1 text-sm">
        {plain.length === 0
          ? 'No wire sits in the flow: every wire keeps its specified kind.'
          : `Plain wire, not barbed, for ${plain.map((wire) => `${wireName(wire.index)} (${m(wire.heightM, 2)})`).join(', ')}: ${plain.length === 1 ? 'it sits' : 'they sit'} in the flow.`}
      </p>
      <Why summary="Wire by wire">
        <ul className="mb-2 flex flex-col gap-1 text-bark-700">
          {layout.wires.map((wire) => (
            <li key={wire.index}>
              <span className="font-semibold text-bark-900">
                {wireName(wire.index)}, {m(wire.heightM, 2)}: {wire.kind}
              </span>{' '}
              — {wire.reason}
            </li>
          ))}
        </ul>
      </Why>
    </Section>
  );
}

/** A unit as written after a quantity: nothing for a count, "rolls" for more than one roll. */
const unitOf = (unit: string, quantity: number) => (unit === 'each' ? '' : unit === 'roll' && quantity !== 1 ? 'rolls' : unit);

/** Each distinct reason given for the posts, with the chainages of the posts it applies to. */
function reasonsByPost(posts: DesignedCrossingView['layout']['posts']): [string, number[]][] {
  const byReason = new Map<string, number[]>();
  for (const post of posts) {
    for (const reason of [...post.reasons, ...(post.hungDropper ? [post.hungDropper.reason] : [])]) {
      byReason.set(reason, [...(byReason.get(reason) ?? []), post.chainageM]);
    }
  }
  return [...byReason];
}

function MaterialsSection({ design }: { design: DesignedCrossingView }) {
  const { items, warnings } = design.materials;
  if (items.length === 0) return null;
  return (
    <Section title="Materials for this crossing">
      <div className="mt-2 overflow-x-auto">
        <table className="w-full text-left text-sm">
          <thead>
            <tr className="border-b border-sand-300 text-bark-700">
              <th className="py-1 pr-2 font-semibold">Item</th>
              <th className="py-1 text-right font-semibold">Quantity</th>
            </tr>
          </thead>
          <tbody>
            {items.map((item, index) => (
              <tr key={`${item.code}-${index}`} className="border-b border-sand-200 align-top">
                <td className="py-1.5 pr-2">{item.description}</td>
                <td className="py-1.5 text-right tabular-nums whitespace-nowrap">
                  {Number.isInteger(item.quantity) ? item.quantity : item.quantity.toFixed(1)} {unitOf(item.unit, item.quantity)}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <Why summary="How each was counted">
        <ul className="mb-2 list-disc space-y-1 pl-5 text-bark-700">
          {items.map((item, index) => (
            <li key={`${item.code}-${index}`}>
              <span className="font-semibold text-bark-900">{item.description}:</span> {item.reason}
            </li>
          ))}
        </ul>
      </Why>
      {warnings.map((warning) => (
        <p key={warning} className="mt-2 rounded-lg border-l-4 border-ochre-600 bg-sand-100 px-3 py-2 text-sm">
          {warning}
        </p>
      ))}
    </Section>
  );
}

function Cautions({ cautions }: { cautions: readonly string[] }) {
  return (
    <aside className="mt-5 rounded-lg border-2 border-ochre-600 bg-sand-100 p-3 text-sm text-bark-900" aria-label="Safety cautions">
      <p className="font-bold">Safety</p>
      <ul className="mt-1 list-disc space-y-1 pl-5">
        {cautions.map((caution) => (
          <li key={caution}>{caution}</li>
        ))}
      </ul>
    </aside>
  );
}

// ---- ground profile ---------------------------------------------------------------------------

const PROFILE_W = 320;
const PROFILE_H = 130;

/** The ground along the fence around the crossing, with the design flood and the end strainers. */
function GroundProfile({ design }: { design: DesignedCrossingView }) {
  const { layout } = design;
  const known = (design.profile ?? []).filter((point): point is { chainageM: number; elevationM: number } => point.elevationM !== null);
  if (known.length < 2) return null;
  // Frame the span between the flex-run ends (or the end strainers), with a margin.
  const [startStrainer, endStrainer] = layout.endStrainers;
  const margin = Math.max(10, (endStrainer.chainageM - startStrainer.chainageM) * 0.25);
  const fromM = Math.max(known[0]!.chainageM, startStrainer.chainageM - margin);
  const toM = Math.min(known[known.length - 1]!.chainageM, endStrainer.chainageM + margin);
  const shown = known.filter((point) => point.chainageM >= fromM && point.chainageM <= toM);
  if (shown.length < 2) return null;
  const lowM = Math.min(...shown.map((point) => point.elevationM));
  const highM = Math.max(layout.designLevelM, ...shown.map((point) => point.elevationM));
  const padM = Math.max(0.2, (highM - lowM) * 0.15);
  const x = (chainageM: number) => ((chainageM - fromM) / (toM - fromM || 1)) * PROFILE_W;
  const y = (elevationM: number) => PROFILE_H - 14 - ((elevationM - lowM + padM) / (highM - lowM + 2 * padM)) * (PROFILE_H - 20);
  const ground = shown.map((point) => `${x(point.chainageM).toFixed(1)},${y(point.elevationM).toFixed(1)}`).join(' ');
  const water = shown.filter((point) => point.chainageM >= layout.wetZone.startChainageM && point.chainageM <= layout.wetZone.endChainageM);
  const waterPath =
    water.length > 1
      ? `M${x(water[0]!.chainageM)},${y(layout.floodLevelM)} ` +
        water.map((point) => `L${x(point.chainageM).toFixed(1)},${Math.max(y(point.elevationM), y(layout.floodLevelM)).toFixed(1)}`).join(' ') +
        ` L${x(water[water.length - 1]!.chainageM)},${y(layout.floodLevelM)} Z`
      : null;
  return (
    <figure className="mt-4">
      <svg viewBox={`0 0 ${PROFILE_W} ${PROFILE_H}`} className="h-auto w-full rounded-lg border border-sand-300 bg-white" role="img" aria-label="Ground along the fence with the design flood">
        {waterPath && <path d={waterPath} fill={PLAN_COLOURS.floodgate} fillOpacity="0.35" />}
        <line x1="0" x2={PROFILE_W} y1={y(layout.designLevelM)} y2={y(layout.designLevelM)} stroke={PLAN_COLOURS.floodgate} strokeDasharray="5 4" strokeWidth="1.2" />
        <polyline points={`0,${PROFILE_H} ${ground} ${PROFILE_W},${PROFILE_H}`} fill="#e8dcc7" stroke="none" />
        <polyline points={ground} fill="none" stroke="#4a3a2e" strokeWidth="2" />
        {layout.endStrainers.map((strainer) => (
          <rect key={strainer.side} x={x(strainer.chainageM) - 4} y={y(strainer.groundM ?? lowM) - 14} width="8" height="14" fill={PLAN_COLOURS.ink} />
        ))}
        <text x="4" y="12" fontSize="10" fill="#4a3a2e">
          flood + freeboard {m(layout.designLevelM, 2)}
        </text>
        <text x="4" y={PROFILE_H - 3} fontSize="10" fill="#4a3a2e">
          {formatChainage(fromM)}
        </text>
        <text x={PROFILE_W - 4} y={PROFILE_H - 3} fontSize="10" fill="#4a3a2e" textAnchor="end">
          {formatChainage(toM)}
        </text>
      </svg>
      <figcaption className="mt-1 text-xs text-bark-700">
        Ground along the fence (height exaggerated), the design flood in blue and the end strainers in black.
      </figcaption>
    </figure>
  );
}

// ---- realignment ----------------------------------------------------------------------------

function Realignment({
  propertyId,
  summary,
  canEdit,
  preview,
  onPreview,
  onRealigned,
}: {
  propertyId: number;
  summary: CrossingSummaryView;
  canEdit: boolean;
  preview: RealignmentPreview | null;
  onPreview: (preview: RealignmentPreview | null) => void;
  onRealigned: (fenceLine: FenceLine) => Promise<void>;
}) {
  const [problem, setProblem] = useState<string | null>(null);
  const suggest = useMutation({
    mutationFn: () => api.getRealignment(propertyId, summary.id).then((answer) => answer.realignment),
    onSuccess: (realignment) => {
      if (!realignment.suggestion.ok) {
        setProblem(realignment.suggestion.reason);
        onPreview(null);
        return;
      }
      setProblem(null);
      const { coordinates, addedLengthM, newAngleDeg, replacedChainageRange } = realignment.suggestion;
      onPreview({
        crossingId: summary.id,
        fenceLineId: realignment.fenceLine.id,
        fenceVersion: realignment.fenceLine.version,
        coordinates,
        addedLengthM,
        newAngleDeg,
        replacedChainageRange,
      });
    },
  });
  const accept = useMutation({
    mutationFn: (version: number) => api.acceptRealignment(propertyId, summary.id, version).then((answer) => answer.fenceLine),
    onSuccess: async (fenceLine) => {
      onPreview(null);
      await onRealigned(fenceLine);
    },
  });
  const error = suggest.error ?? accept.error;

  return (
    <div className="mt-3">
      {!preview && (
        <button type="button" className="btn-quiet w-full" onClick={() => suggest.mutate()} disabled={suggest.isPending}>
          {suggest.isPending ? 'Working out a square crossing…' : 'Suggest a square crossing'}
        </button>
      )}
      {problem && (
        <p className="mt-2 rounded-lg border border-sand-300 bg-sand-100 p-2 text-sm" role="status">
          No square crossing to suggest here: {problem}
        </p>
      )}
      {preview && (
        <div className="rounded-lg border-2 p-3 text-sm" style={{ borderColor: PLAN_COLOURS.realign }} data-testid="realign-preview" role="status">
          <p className="font-semibold">Suggested square crossing</p>
          <p className="mt-1">
            The dashed green line on the map is the fence with a dog-leg that crosses the channel at {Math.round(preview.newAngleDeg)}°. It replaces the fence from{' '}
            {formatChainage(preview.replacedChainageRange.fromM)} to {formatChainage(preview.replacedChainageRange.toM)} and adds {m(preview.addedLengthM, 0)} of fence.
          </p>
          <div className="mt-3 flex flex-wrap gap-2">
            {canEdit && (
              <button
                type="button"
                className="btn-primary flex-1"
                data-testid="realign-accept"
                onClick={() => accept.mutate(preview.fenceVersion)}
                disabled={accept.isPending}
              >
                {accept.isPending ? 'Moving the fence line…' : 'Accept'}
              </button>
            )}
            <button type="button" className="btn-quiet flex-1" onClick={() => onPreview(null)} disabled={accept.isPending}>
              {canEdit ? 'Reject' : 'Hide suggestion'}
            </button>
          </div>
          {!canEdit && <p className="mt-2 text-bark-700">A manager or owner can accept it.</p>}
        </div>
      )}
      {error && (
        <p className="alert-error mt-2 text-sm" role="alert">
          {error.message}
        </p>
      )}
    </div>
  );
}

// ---- inputs ---------------------------------------------------------------------------------

type NumberField = 'floodMarkM' | 'channelN' | 'overbankN' | 'runoffCoefficient' | 'aepPercent' | 'freeboardM';

const NUMBER_FIELDS: { key: NumberField; label: string; hint: string; example: string }[] = [
  { key: 'floodMarkM', label: 'Flood mark (m above the bed)', hint: 'Height of the debris line above the channel bed. An observed mark beats the rainfall estimate.', example: '0.8' },
  { key: 'channelN', label: "Channel roughness (Manning's n)", hint: 'About 0.03 for a clean sandy bed, up to 0.1 or more with heavy scrub.', example: '0.04' },
  { key: 'overbankN', label: "Overbank roughness (Manning's n)", hint: 'The banks and flats beside the channel.', example: '0.035' },
  { key: 'runoffCoefficient', label: 'Runoff coefficient C (0–1)', hint: 'The share of the rain that runs off.', example: '0.3' },
  { key: 'aepPercent', label: 'Design flood chance each year (AEP %)', hint: 'Must be one of the rainfall table’s.', example: '5' },
  { key: 'freeboardM', label: 'Freeboard (m)', hint: 'Extra height above the flood level for the wet zone.', example: '0.3' },
];

type FormValues = Record<NumberField, string> & { style: CrossingStyle };

function valuesOf(crossing: CrossingDetailView): FormValues {
  const text = (value: number | null | undefined) => (value === null || value === undefined ? '' : String(value));
  return {
    floodMarkM: text(crossing.inputs.floodMarkM),
    channelN: text(crossing.inputs.channelN),
    overbankN: text(crossing.inputs.overbankN),
    runoffCoefficient: text(crossing.inputs.runoffCoefficient),
    aepPercent: text(crossing.inputs.aepPercent),
    freeboardM: text(crossing.inputs.freeboardM),
    style: crossing.inputs.style ?? 'continuous-floodgate',
  };
}

/** What the design used where the crossing's own input is blank (the property's settings). */
function defaultsOf(crossing: CrossingDetailView): Partial<Record<NumberField, string>> & { aepChoices?: number[] } {
  const design = crossing.design;
  const used = isDesigned(design) ? design.used : undefined;
  const floods = design && 'floods' in design ? design.floods : undefined;
  const flood = floods?.fromRainfall?.flood;
  return {
    channelN: used?.channelN?.toString(),
    overbankN: used?.overbankN?.toString(),
    freeboardM: used?.freeboardM?.toString(),
    runoffCoefficient: flood?.inputs?.runoffCoefficient?.toString(),
    aepPercent: flood?.aepPercent.toString(),
    aepChoices: flood?.inputs?.ifd?.aepPercent,
  };
}

/** The crossing's own inputs: a blank field uses the property's setting. The answer is the crossing designed again. */
function InputsForm({ propertyId, crossing, formRef }: { propertyId: number; crossing: CrossingDetailView; formRef: React.RefObject<HTMLFormElement | null> }) {
  const queryClient = useQueryClient();
  const idPrefix = useId();
  const [values, setValues] = useState<FormValues>(() => valuesOf(crossing));
  const [errors, setErrors] = useState<Partial<Record<NumberField | 'style', string>>>({});
  const [message, setMessage] = useState<string | null>(null);
  const defaults = defaultsOf(crossing);
  const initial = useRef(valuesOf(crossing));

  const save = useMutation({
    mutationFn: (changes: CrossingInputsChange) => api.setCrossingInputs(propertyId, crossing.id, changes).then((answer) => answer.crossing),
    onSuccess: (redesigned) => {
      // Shown at once under both keys: the old one until the list catches up, then the new one.
      queryClient.setQueryData(crossingDetailQuery(propertyId, crossing.id, crossing.computedAt).queryKey, redesigned);
      queryClient.setQueryData(crossingDetailQuery(propertyId, crossing.id, redesigned.computedAt).queryKey, redesigned);
      void queryClient.invalidateQueries({ queryKey: ['crossings', propertyId] });
      initial.current = valuesOf(redesigned);
      setValues(valuesOf(redesigned));
      setMessage(`Designed again: ${DESIGN_STATUS_LABEL[redesigned.designStatus]?.toLowerCase() ?? redesigned.designStatus}.`);
    },
    onError: (error) => {
      if (error instanceof ApiError && Object.keys(error.fields).length) setErrors(error.fields);
    },
  });

  const submit = (event: SyntheticEvent<HTMLFormElement>) => {
    event.preventDefault();
    setMessage(null);
    const changes: CrossingInputsChange = {};
    const found: Partial<Record<NumberField | 'style', string>> = {};
    const numbers: Record<string, number> = {};
    for (const field of NUMBER_FIELDS) {
      const text = values[field.key].trim().replace(',', '.');
      if (text === initial.current[field.key].trim()) continue;
      if (text === '') {
        changes[field.key] = null;
        continue;
      }
      const value = Number(text);
      if (!Number.isFinite(value)) {
        found[field.key] = `Enter a number, for example ${field.example}.`;
        continue;
      }
      changes[field.key] = value;
      numbers[field.key] = value;
    }
    if (values.style !== initial.current.style) changes.style = values.style;
    // The same checks as the server, for an answer before the round trip.
    const checked = crossingInputsSchema.safeParse(numbers);
    if (!checked.success) {
      for (const issue of checked.error.issues) {
        const key = String(issue.path[0]) as NumberField;
        found[key] ??= issue.message;
      }
    }
    setErrors(found);
    if (Object.keys(found).length) return;
    if (Object.keys(changes).length === 0) {
      setMessage('Nothing changed.');
      return;
    }
    save.mutate(changes);
  };

  const field = (key: NumberField | 'style') => ({
    id: `${idPrefix}-${key}`,
    'aria-invalid': errors[key] ? true : undefined,
    'aria-describedby': `${idPrefix}-${key}-hint${errors[key] ? ` ${idPrefix}-${key}-error` : ''}`,
  });

  return (
    <Section title="What you know about this crossing">
      <form ref={formRef} className="mt-2 flex scroll-mt-4 flex-col gap-3" onSubmit={submit} noValidate data-testid="crossing-inputs-form" aria-label="Crossing inputs">
        {NUMBER_FIELDS.map(({ key, label, hint }) => {
          const fallback = key === 'floodMarkM' ? null : defaults[key];
          const choices = key === 'aepPercent' && defaults.aepChoices ? ` Table: ${defaults.aepChoices.join(', ')} %.` : '';
          return (
            <div className="field" key={key}>
              <label htmlFor={`${idPrefix}-${key}`}>{label}</label>
              <input
                {...field(key)}
                type="text"
                inputMode="decimal"
                autoComplete="off"
                value={values[key]}
                onChange={(event) => setValues({ ...values, [key]: event.target.value })}
              />
              <p id={`${idPrefix}-${key}-hint`} className="text-xs text-bark-700">
                {hint}
                {choices}
                {key === 'floodMarkM' ? ' Blank: none.' : fallback !== undefined ? ` Blank uses the property’s ${fallback}.` : ' Blank uses the property’s setting.'}
              </p>
              {errors[key] && (
                <p id={`${idPrefix}-${key}-error`} className="field-error" role="alert">
                  {errors[key]}
                </p>
              )}
            </div>
          );
        })}
        <div className="field">
          <label htmlFor={`${idPrefix}-style`}>Floodgate style</label>
          <select {...field('style')} value={values.style} onChange={(event) => setValues({ ...values, style: event.target.value as CrossingStyle })}>
            <option value="continuous-floodgate">Continuous floodgate</option>
            <option value="drop-down-section">Drop-down section</option>
          </select>
          <p id={`${idPrefix}-style-hint`} className="text-xs text-bark-700">
            Continuous: the wires run through and the floodgate swings up. Drop-down: a light section between end assemblies that lets go in a flood.
          </p>
          {errors.style && (
            <p id={`${idPrefix}-style-error`} className="field-error" role="alert">
              {errors.style}
            </p>
          )}
        </div>
        {save.error && !(save.error instanceof ApiError && Object.keys(save.error.fields).length) && (
          <p className="alert-error text-sm" role="alert">
            {save.error.message}
          </p>
        )}
        {save.error instanceof ApiError && Object.keys(save.error.fields).length > 0 && (
          <p className="alert-error text-sm" role="alert">
            {save.error.message} See the fields marked above.
          </p>
        )}
        <button type="submit" className="btn-primary" disabled={save.isPending}>
          {save.isPending ? 'Designing again…' : 'Save and design again'}
        </button>
        <p className="text-sm font-semibold text-saltbush-700" role="status">
          {message}
        </p>
      </form>
    </Section>
  );
}
