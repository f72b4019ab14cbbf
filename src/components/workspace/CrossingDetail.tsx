import { useQuery } from '@tanstack/react-query';
import { useEffect, useRef } from 'react';
import type { CrossingSummaryView } from '../../lib/schemas/crossing-view';
import type { FenceLine } from '../../lib/schemas/plan';
import { CatchmentSection } from './crossing/CatchmentSection';
import { crossingDetailQuery } from './crossing/crossing-detail-query';
import { CrossingHeader } from './crossing/CrossingHeader';
import { CrossingInputsForm } from './crossing/CrossingInputsForm';
import { DesignProblem } from './crossing/DesignProblem';
import { DesignSections } from './crossing/DesignSections';
import { FloodSection } from './crossing/FloodSection';
import { InspectionHistory } from './crossing/InspectionHistory';
import { isDesigned } from './crossing/is-designed';
import { KindNote } from './crossing/KindNote';
import { RealignmentBox, type RealignmentPreview } from './crossing/RealignmentBox';
import { StyleComparison } from './crossing/StyleComparison';
import { SafetyCautions } from './crossing/WarningsAndCautions';

export { crossingDetailQuery, type RealignmentPreview };

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

/** One crossing: its angle, catchment, design floods, floodgate layout with reasons, checks, materials, both styles compared, and cautions. */
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
  const canRealign = (summary.angleClass === 'fair' || summary.angleClass === 'poor') && (summary.kind === 'crossing' || summary.kind === 'crosses-twice');

  useEffect(() => {
    if (!revealSeq) return;
    const reduceMotion = window.matchMedia('(prefers-reduced-motion: reduce)').matches;
    sectionRef.current?.scrollIntoView({ block: 'start', behavior: reduceMotion ? 'auto' : 'smooth' });
    headingRef.current?.focus({ preventScroll: true });
  }, [revealSeq]);

  return (
    <section ref={sectionRef} className="card scroll-mt-2 p-4" aria-labelledby="crossing-detail-heading" data-testid="crossing-detail">
      <CrossingHeader summary={summary} headingRef={headingRef} onClose={onClose} notice={notice} />
      <button type="button" className="btn-quiet mt-3 w-full" onClick={onShowOnMap}>
        Show on the map
      </button>

      {canRealign && (
        <RealignmentBox
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
            <>
              <DesignSections design={design} crossing={crossing} onEditInputs={editInputs} />
              {design.comparison && <StyleComparison propertyId={propertyId} crossing={crossing} comparison={design.comparison} canEdit={canEdit} />}
            </>
          ) : design && 'problem' in design ? (
            <>
              <DesignProblem designStatus={crossing.designStatus} design={design} canEdit={canEdit} />
              {design.floods && <FloodSection floods={design.floods} onEditInputs={editInputs} />}
            </>
          ) : null}
          {canChangeInputs && <CrossingInputsForm key={crossing.id} propertyId={propertyId} crossing={crossing} formRef={formRef} />}
        </>
      ) : null}

      <InspectionHistory propertyId={propertyId} crossingId={summary.id} />

      <SafetyCautions cautions={design?.cautions} />
    </section>
  );
}
