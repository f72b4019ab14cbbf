import type { DesignStatus, UndesignedCrossingView } from '../../../lib/schemas/crossing-view';
import { DESIGN_STATUS_LABEL } from './labels';
import { Why } from './Why';

type Props = {
  designStatus: DesignStatus;
  design: UndesignedCrossingView;
  canEdit: boolean;
};

/** Why the crossing has no floodgate layout, and for a missing flood mark, who can enter one. */
export function DesignProblem({ designStatus, design, canEdit }: Props) {
  return (
    <div className="mt-4 rounded-lg border border-ochre-600 bg-sand-100 p-3 text-sm" role="status">
      <p className="font-semibold">{DESIGN_STATUS_LABEL[designStatus] ?? 'Not designed'}</p>
      <ProblemText text={design.problem} />
      {design.status === 'needs-input' && !canEdit && <p className="mt-1">A manager or owner can enter a flood mark.</p>}
    </div>
  );
}

/** The plain sentence first, a technical note in brackets at its end folded away. */
function ProblemText({ text }: { text: string }) {
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
