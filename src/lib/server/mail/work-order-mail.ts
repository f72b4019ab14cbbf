import { CROSSING_STYLE_WORDS, type WorkOrderSheet } from '../../schemas/work-order';
import type { MailAttachment, MailMessage } from './send-mail';
import { renderMail } from './templates';

const money = (cents: number) => new Intl.NumberFormat('en-AU', { style: 'currency', currency: 'AUD' }).format(cents / 100);
const day = (date: Date | string) => new Date(date).toLocaleDateString('en-AU', { day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' });

/**
 * The message that hands a work order to a crew member or a contractor: what to build (each
 * crossing with its style, and what a drop-down section means), the materials with costs, the
 * cautions, the link to the order on a phone, and the order's GPX and GeoJSON files attached.
 */
export function workOrderMail(input: {
  to: string;
  senderName: string;
  sheet: WorkOrderSheet;
  link: string;
  linkExpiresAt: Date | null;
  /** The link is a contractor's read-only one, not the signed-in crew view. */
  contractor: boolean;
  attachments: MailAttachment[];
}): MailMessage {
  const { order, materials, cautions, propertyName, layoutPointCount } = input.sheet;
  const items = order.items.map((item) => {
    if (item.kind === 'fence-line') return `• ${item.label}, ${Math.round(item.lengthM ?? 0)} m.`;
    const style = item.style ? CROSSING_STYLE_WORDS[item.style] : undefined;
    return style ? `• ${item.label}: ${style.name}. ${style.build}` : `• ${item.label}: not designed yet; ask before building.`;
  });
  const materialLines = materials.lines.map((line) => `• ${line.description}: ${line.quantity} ${line.unit} (${money(line.totalCents)})`);
  const unpriced = materials.unpriced.map((item) => `• ${item.description}: ${item.quantity} ${item.unit} (no price in the list)`);
  const paragraphs = [
    `${input.senderName} sent you a work order on ${propertyName}: "${order.title}".`,
    ...(order.targetDate ? [`Target date: ${day(`${order.targetDate}T00:00:00Z`)}.`] : []),
    ...(order.notes ? [`Notes: ${order.notes}`] : []),
    // One paragraph per line: the HTML part keeps each on its own line.
    `What to build (${order.items.length} item${order.items.length === 1 ? '' : 's'}):`,
    ...items,
    `Materials${materials.complete ? '' : ' (some items have no price, so the total is part of the cost)'}:`,
    ...(materialLines.length + unpriced.length ? [...materialLines, ...unpriced] : ['• none counted']),
    `Materials ${money(materials.materialsCents)}, labour ${materials.labourDays.toFixed(1)} crew days ${money(materials.labourCents)}, total ${money(materials.totalCents)}.`,
    `Positions: ${layoutPointCount} end strainers, posts and breakaway ties are in the attached files (GPX for a handheld GPS, GeoJSON for a mapping app).`,
    'Safety:',
    ...cautions.map((caution) => `• ${caution}`),
    input.contractor
      ? `The link opens the order on your phone, read-only, without signing in${input.linkExpiresAt ? `; it works until ${day(input.linkExpiresAt)}` : ''}. Tell ${input.senderName} as you finish each part.`
      : 'The link opens the order on your phone after you sign in; mark each fence line and crossing Started, Done or Blocked as you go.',
  ];
  const message = renderMail({
    to: input.to,
    subject: `Work order: ${order.title} (${propertyName})`,
    heading: order.title,
    paragraphs,
    action: { label: 'Open the work order', url: input.link },
    footer: 'Gullyline work order. Local codes, permits for works in watercourses and licensed practice take precedence over this plan.',
  });
  return { ...message, attachments: input.attachments };
}
