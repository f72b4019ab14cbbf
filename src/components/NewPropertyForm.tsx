import { useMutation, useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { ApiError, api } from '../lib/client/api';
import { withQueryClient } from './QueryRoot';

const DEFAULT_CRS = 'EPSG:7854';

/** Creates a property (name, state or region, projected CRS) and opens its workspace. */
function NewPropertyForm() {
  const [name, setName] = useState('');
  const [region, setRegion] = useState('');
  const [crs, setCrs] = useState(DEFAULT_CRS);
  const crsCode = crs.trim().toUpperCase();
  const crsLookup = useQuery({
    queryKey: ['crs', crsCode],
    queryFn: () => api.describeCrs(crsCode),
    enabled: /^EPSG:\d{4,6}$/.test(crsCode),
    retry: false,
  });
  const create = useMutation({
    mutationFn: api.createProperty,
    onSuccess: ({ property }) => location.assign(`/app/properties/${property.id}`),
  });
  const fields = create.error instanceof ApiError ? create.error.fields : {};

  function submit(event: { preventDefault(): void }) {
    event.preventDefault();
    create.mutate({ name, region, crs: crsCode });
  }

  return (
    <form onSubmit={submit} className="flex flex-col gap-4" noValidate aria-label="New property">
      {create.error && (
        <div className="alert-error" role="alert">
          {create.error.message}
        </div>
      )}
      <div className="field">
        <label htmlFor="property-name">Property name</label>
        <input id="property-name" value={name} onChange={(e) => setName(e.target.value)} aria-invalid={!!fields.name} required />
        {fields.name && <p className="field-error">{fields.name}</p>}
      </div>
      <div className="field">
        <label htmlFor="property-region">State or region</label>
        <input id="property-region" value={region} onChange={(e) => setRegion(e.target.value)} placeholder="e.g. Western Division, NSW" />
        {fields.region && <p className="field-error">{fields.region}</p>}
      </div>
      <div className="field">
        <label htmlFor="property-crs">Map grid (EPSG code of a projected CRS)</label>
        <input id="property-crs" value={crs} onChange={(e) => setCrs(e.target.value)} aria-invalid={!!fields.crs} aria-describedby="crs-note" />
        <p id="crs-note" className={`text-sm ${crsLookup.isError || fields.crs ? 'text-clay-600' : 'text-bark-500'}`}>
          {fields.crs ??
            (crsLookup.isError
              ? crsLookup.error.message
              : crsLookup.data
                ? crsLookup.data.name
                : 'The grid your elevation models use, e.g. EPSG:7854 for GDA2020 / MGA zone 54.')}
        </p>
      </div>
      <button type="submit" className="btn-primary self-start" disabled={create.isPending}>
        {create.isPending ? 'Creating…' : 'Create property'}
      </button>
    </form>
  );
}

export default withQueryClient(NewPropertyForm);
