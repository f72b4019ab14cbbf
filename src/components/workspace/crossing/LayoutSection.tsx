import type { FloodgateLayoutView } from '../../../lib/schemas/crossing-view';
import { Facts } from './Facts';
import { formatChainage, formatMetres } from './format';
import { LayoutPosts } from './LayoutPosts';
import { STYLE_LABEL } from './labels';
import { Section } from './Section';
import { Why } from './Why';

/** The floodgate layout: wet zone, end strainers, flex runs, posts and droppers, breakaway tie and wires, each with its reasons. */
export function LayoutSection({ layout }: { layout: FloodgateLayoutView }) {
  const plain = layout.wires.filter((wire) => wire.mustBePlain);
  const detail = layout.styleDetail;
  const wireName = (index: number) => `wire ${index + 1}`;
  return (
    <Section title={`Floodgate layout: ${STYLE_LABEL[layout.style] ?? layout.style}`}>
      <Facts
        rows={[
          ['Design flood level', formatMetres(layout.floodLevelM, 2)],
          ['With freeboard', formatMetres(layout.designLevelM, 2)],
          ['Wet zone', `${formatChainage(layout.wetZone.startChainageM)} – ${formatChainage(layout.wetZone.endChainageM)}`],
          ['Wet zone length', formatMetres(layout.wetZone.lengthM, 1)],
          ['Deepest water in it', formatMetres(layout.wetZone.maxDepthM, 2)],
          ['Floodgate length', formatMetres(layout.floodgate.lengthM, 1)],
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
            <p className="text-bark-700">{formatMetres(strainer.setbackFromWetZoneM, 0)} back from the wet zone{strainer.groundM !== null ? `, ground ${formatMetres(strainer.groundM, 2)}` : ''}</p>
            <Why reasons={[...strainer.reasons, ...strainer.warnings]} />
          </li>
        ))}
      </ul>

      <h4 className="mt-3 text-sm font-bold">Flex runs</h4>
      <p className="mt-1 text-sm">
        {detail.wiresRunThrough
          ? `${formatMetres(detail.flexRunEachSideM, 0)} of strained wire each side (rule of thumb at least ${formatMetres(detail.recommendedMinFlexRunM, 0)}); the wires run unbroken through the floodgate.`
          : 'None: the wires end at the end strainers and the drop-down section between them is light and sacrificial.'}
      </p>
      <Why reasons={detail.reasons} />

      <LayoutPosts posts={layout.posts} heavyPostsReason={layout.heavyPosts.reason} />

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
          : `Plain wire, not barbed, for ${plain.map((wire) => `${wireName(wire.index)} (${formatMetres(wire.heightM, 2)})`).join(', ')}: ${plain.length === 1 ? 'it sits' : 'they sit'} in the flow.`}
      </p>
      <Why summary="Wire by wire">
        <ul className="mb-2 flex flex-col gap-1 text-bark-700">
          {layout.wires.map((wire) => (
            <li key={wire.index}>
              <span className="font-semibold text-bark-900">
                {wireName(wire.index)}, {formatMetres(wire.heightM, 2)}: {wire.kind}
              </span>{' '}
              — {wire.reason}
            </li>
          ))}
        </ul>
      </Why>
    </Section>
  );
}

/** A pass or fail, in words as well as a mark and colour. */
function Check({ ok, yes, no }: { ok: boolean; yes: string; no: string }) {
  return ok ? (
    <span className="font-semibold text-saltbush-700">✓ {yes}</span>
  ) : (
    <span className="font-semibold text-clay-600">✗ {no}</span>
  );
}
