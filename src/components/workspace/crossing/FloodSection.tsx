import type { ReactNode } from 'react';
import type { CrossingFloodsView } from '../../../lib/schemas/crossing-view';
import { Facts } from './Facts';
import { formatMetres, formatValue } from './format';
import { Section } from './Section';
import { Why } from './Why';

/** The design flood worked out from a flood mark, from rainfall, and from a given flow, with the one the design used. */
export function FloodSection({ floods, onEditInputs }: { floods: CrossingFloodsView; onEditInputs?: () => void }) {
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
                  ['Flood level', formatMetres(mark.stageM, 2)],
                  ['Deepest water', formatMetres(mark.maxDepthM, 2)],
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
                  ['Flood level', rainfall.level.overtopped ? 'over the profile' : formatMetres(rainfall.level.stageM, 2)],
                  ['Deepest water', formatMetres(rainfall.level.maxDepthM, 2)],
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
                ['Flood level', discharge.overtopped ? 'over the profile' : formatMetres(discharge.stageM, 2)],
                ['Deepest water', formatMetres(discharge.maxDepthM, 2)],
              ]}
            />
          </FloodMethod>
        )}
      </div>
      {floods.chosen && (
        <Facts
          rows={[
            ['Design flood level', formatMetres(floods.levelM, 2)],
            ['Deepest water', formatMetres(floods.maxDepthM, 2)],
            ['Mean velocity', formatValue(floods.meanVelocityMs, 2, 'm/s')],
            ['Width of water', formatMetres(floods.wettedWidthM, 1)],
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

/** One way of working out the flood, outlined when the design used it. */
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
