import { selectCrossingsForRain, type RainCandidate, type RainScope } from '../../crossings/select-crossings-for-rain';
import type { RainEventInput } from '../../schemas/inspection';
import { ValidationError } from '../http';
import { inspectionRoundMail } from '../mail/inspection-mail';
import { enqueueMail } from '../mail/outbox';
import { absoluteUrl } from '../mail/templates';
import { listCrossings } from '../repos/crossings';
import { insertRainEventWithRound } from '../repos/inspections';
import { listMembers } from '../repos/memberships';
import { listPaddocks } from '../repos/paddocks';
import { catchmentAt } from '../terrain/terrain-queries';

/** How far a crossing's point is moved onto its channel before its catchment is traced (as the analysis does). */
const SNAP_M = 30;

/** The page a crew member opens on a phone for a round. */
export const roundPath = (propertyId: number, roundId: number) => `/app/properties/${propertyId}/inspections/${roundId}`;

/**
 * Records a rain event and opens its inspection round: the crossings whose catchment had the
 * rain (`selectCrossingsForRain`: the whole property, or catchment outlines traced from the
 * processed terrain meeting a chosen paddock, a crossing's point where no outline can be traced),
 * largest catchment first; each crew member of the property gets an e-mail with the round's link.
 * @throws ValidationError naming `paddockIds` when one is not a paddock of this property
 */
export async function recordRainEvent(propertyId: number, input: RainEventInput, user: { id: number; name: string }, origin: string) {
  const crossings = await listCrossings(propertyId);
  let scope: RainScope = { kind: 'property' };
  let paddockNames: string[] = [];
  const candidates: RainCandidate[] = [];
  if (input.scope === 'paddocks') {
    const paddocks = await listPaddocks(propertyId);
    const missing = input.paddockIds.filter((id) => !paddocks.some((paddock) => paddock.id === id));
    if (missing.length) throw new ValidationError({ paddockIds: `No paddock with id ${missing.join(', ')} on this property.` });
    const chosen = paddocks.filter((paddock) => input.paddockIds.includes(paddock.id));
    scope = { kind: 'paddocks', paddocks: chosen };
    paddockNames = chosen.map((paddock) => paddock.name);
  }
  for (const crossing of crossings) {
    // The outline is traced only when paddocks are chosen; without a processed model it is null.
    const outline = scope.kind === 'paddocks' ? await catchmentAt(propertyId, crossing.position, SNAP_M).catch(() => null) : null;
    candidates.push({ id: crossing.id, position: crossing.position, catchmentHa: crossing.upstreamAreaHa, catchmentOutline: outline?.polygon.coordinates ?? null });
  }
  const byId = new Map(crossings.map((crossing) => [crossing.id, crossing]));
  const selected = selectCrossingsForRain(candidates, scope).map((pick) => {
    const crossing = byId.get(pick.id)!;
    return { ...pick, label: `${crossing.fenceName} at ${Math.round(crossing.chainageM)} m`, style: crossing.style };
  });
  const where = scope.kind === 'property' ? 'the whole property' : `paddocks ${paddockNames.join(', ')}`;
  return insertRainEventWithRound(propertyId, input, selected, user.id, async ({ roundId, crossingCount }, trx) => {
    const property = (await trx('properties').where({ id: propertyId }).first('name')) as { name: string };
    const crew = (await listMembers(propertyId, trx)).filter((member) => member.role === 'crew');
    for (const member of crew) {
      await enqueueMail(
        inspectionRoundMail({
          to: member.email, propertyName: property.name, recordedByName: user.name, fellOn: input.fellOn, rainfallMm: input.rainfallMm,
          where, crossingCount, roundUrl: absoluteUrl(roundPath(propertyId, roundId), origin),
        }),
        trx,
      );
    }
  });
}
