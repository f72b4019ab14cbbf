import type { MailMessage } from './send-mail';
import { renderMail } from './templates';

/** The message to a crew member when a rain event opens an inspection round: how much rain, how many crossings, the link. */
export function inspectionRoundMail(input: {
  to: string;
  propertyName: string;
  recordedByName: string;
  fellOn: string;
  rainfallMm: number;
  where: string;
  crossingCount: number;
  roundUrl: string;
}): MailMessage {
  const crossings = `${input.crossingCount} crossing${input.crossingCount === 1 ? '' : 's'}`;
  return renderMail({
    to: input.to,
    subject: `Inspect ${crossings} on ${input.propertyName} after ${input.rainfallMm} mm of rain`,
    heading: `Inspection round: ${input.propertyName}`,
    paragraphs: [
      `${input.recordedByName} recorded ${input.rainfallMm} mm of rain on ${input.fellOn} (${input.where}).`,
      input.crossingCount === 0
        ? 'No crossing lies in the rain’s path, so there is nothing to inspect this time.'
        : `Check ${crossings}, largest catchment first. The link opens the round on your phone: each crossing says what to look at; record its status, a note and photos.`,
      'Never enter floodwater: wait until the channel is safe to walk. Local codes and licensed practice come before this tool.',
    ],
    action: { label: 'Open the inspection round', url: input.roundUrl },
  });
}
