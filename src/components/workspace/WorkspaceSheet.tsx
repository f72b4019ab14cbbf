import { useId, useState, type ReactNode } from 'react';

export const SHEET_SECTIONS = [
  { key: 'crossings', label: 'Crossings' },
  { key: 'plan', label: 'Plan' },
  { key: 'terrain', label: 'Terrain' },
  { key: 'files', label: 'Files' },
] as const;
export type SheetSection = (typeof SHEET_SECTIONS)[number]['key'];

type Props = {
  section: SheetSection;
  onSection: (section: SheetSection) => void;
  /** Shown above the sections whatever is chosen: the edit under way, the open fence line or crossing. */
  top: ReactNode;
  sections: Record<SheetSection, ReactNode>;
  /** A short count beside a section's name (e.g. the number of crossings). */
  counts?: Partial<Record<SheetSection, number>>;
  /** Static notes under every section (the safety note). */
  footer?: ReactNode;
};

/**
 * The workspace's panels. Side by side with the map on a wide screen; on a phone a sheet under the
 * map, half open by default and pulled up to most of the screen with its handle. The sections stay
 * mounted when hidden, so an upload or a form keeps its state while another section is read.
 */
export function WorkspaceSheet({ section, onSection, top, sections, counts = {}, footer }: Props) {
  const [expanded, setExpanded] = useState(false);
  const id = useId();
  return (
    <aside
      className={`flex w-full shrink-0 flex-col border-t border-sand-300 bg-sand-50 shadow-[0_-4px_16px_rgba(43,33,24,0.12)] ${
        expanded ? 'h-[82dvh]' : 'h-[42dvh]'
      } md:h-auto md:w-96 md:shrink md:border-l md:border-t-0 md:shadow-none lg:w-[28rem]`}
      aria-label="Property panels"
      data-testid="workspace-panels"
    >
      <button
        type="button"
        className="flex min-h-11 w-full flex-col items-center justify-center gap-1 pt-1.5 text-xs font-semibold text-bark-700 md:hidden"
        aria-expanded={expanded}
        aria-controls={`${id}-body`}
        onClick={() => setExpanded((open) => !open)}
        data-testid="sheet-handle"
      >
        <span aria-hidden="true" className="h-1.5 w-10 rounded-full bg-sand-300" />
        {expanded ? 'Lower the panels' : 'Raise the panels'}
      </button>
      <div className="flex gap-1 border-b border-sand-200 px-2 md:px-4 md:pt-3" role="tablist" aria-label="Panels">
        {SHEET_SECTIONS.map(({ key, label }) => (
          <button
            key={key}
            type="button"
            role="tab"
            id={`${id}-tab-${key}`}
            aria-selected={section === key}
            aria-controls={`${id}-panel-${key}`}
            className={`min-h-11 flex-1 rounded-t-lg px-2 text-sm font-semibold ${
              section === key ? 'border-b-4 border-ochre-600 text-bark-900' : 'text-bark-700 hover:bg-sand-100'
            }`}
            onClick={() => onSection(key)}
            data-testid={`sheet-tab-${key}`}
          >
            {label}
            {counts[key] !== undefined && <span className="ml-1 font-normal tabular-nums">({counts[key]})</span>}
          </button>
        ))}
      </div>
      <div id={`${id}-body`} className="flex min-h-0 flex-1 flex-col gap-4 overflow-y-auto p-4">
        {top}
        {SHEET_SECTIONS.map(({ key }) => (
          <div key={key} role="tabpanel" id={`${id}-panel-${key}`} aria-labelledby={`${id}-tab-${key}`} hidden={section !== key} className="flex flex-col gap-4">
            {sections[key]}
          </div>
        ))}
        {footer}
      </div>
    </aside>
  );
}
