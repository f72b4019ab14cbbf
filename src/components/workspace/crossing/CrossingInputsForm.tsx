import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useId, useRef, useState, type RefObject, type SyntheticEvent } from 'react';
import { ApiError, api } from '../../../lib/client/api';
import type { CrossingDetailView, CrossingInputsChange, CrossingStyle } from '../../../lib/schemas/crossing-view';
import { crossingDetailQuery } from './crossing-detail-query';
import {
  NUMBER_FIELDS,
  collectInputChanges,
  formValuesOf,
  propertyDefaultsOf,
  type InputsFormErrors,
  type InputsFormValues,
  type NumberField,
} from './crossing-inputs';
import { DESIGN_STATUS_LABEL } from './labels';
import { Section } from './Section';

type Props = {
  propertyId: number;
  crossing: CrossingDetailView;
  /** Scrolled to and focused by the detail's "change the inputs" button. */
  formRef: RefObject<HTMLFormElement | null>;
};

/** The crossing's own inputs: a blank field uses the property's setting. The answer is the crossing designed again. */
export function CrossingInputsForm({ propertyId, crossing, formRef }: Props) {
  const queryClient = useQueryClient();
  const idPrefix = useId();
  const [values, setValues] = useState<InputsFormValues>(() => formValuesOf(crossing));
  const [errors, setErrors] = useState<InputsFormErrors>({});
  const [message, setMessage] = useState<string | null>(null);
  const defaults = propertyDefaultsOf(crossing);
  const initial = useRef(formValuesOf(crossing));

  const save = useMutation({
    mutationFn: (changes: CrossingInputsChange) => api.setCrossingInputs(propertyId, crossing.id, changes).then((answer) => answer.crossing),
    onSuccess: (redesigned) => {
      // Shown at once under both keys: the old one until the list catches up, then the new one.
      queryClient.setQueryData(crossingDetailQuery(propertyId, crossing.id, crossing.computedAt).queryKey, redesigned);
      queryClient.setQueryData(crossingDetailQuery(propertyId, crossing.id, redesigned.computedAt).queryKey, redesigned);
      void queryClient.invalidateQueries({ queryKey: ['crossings', propertyId] });
      initial.current = formValuesOf(redesigned);
      setValues(formValuesOf(redesigned));
      setMessage(`Designed again: ${DESIGN_STATUS_LABEL[redesigned.designStatus]?.toLowerCase() ?? redesigned.designStatus}.`);
    },
    onError: (error) => {
      if (error instanceof ApiError && Object.keys(error.fields).length) setErrors(error.fields);
    },
  });

  const submit = (event: SyntheticEvent<HTMLFormElement>) => {
    event.preventDefault();
    setMessage(null);
    const { changes, errors: found } = collectInputChanges(values, initial.current);
    setErrors(found);
    if (Object.keys(found).length) return;
    if (Object.keys(changes).length === 0) {
      setMessage('Nothing changed.');
      return;
    }
    save.mutate(changes);
  };

  const field = (key: NumberField | 'style' | 'debris') => ({
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
        <div className="field">
          <label htmlFor={`${idPrefix}-debris`}>Expected debris</label>
          <select {...field('debris')} value={values.debris} onChange={(event) => setValues({ ...values, debris: event.target.value as InputsFormValues['debris'] })}>
            <option value="">The property’s setting{defaults.debris ? ` (${defaults.debris})` : ''}</option>
            <option value="light">Light: grass and small sticks</option>
            <option value="moderate">Moderate: branches and some logs</option>
            <option value="heavy">Heavy: logs, whole shrubs, fence wreckage</option>
          </select>
          <p id={`${idPrefix}-debris-hint`} className="text-xs text-bark-700">
            What a flood here carries down to the fence, from the debris left after past floods. Heavy debris favours a drop-down section.
          </p>
          {errors.debris && (
            <p id={`${idPrefix}-debris-error`} className="field-error" role="alert">
              {errors.debris}
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
