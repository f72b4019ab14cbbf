import type {
  CrossingCollection,
  CrossingDetailView,
  CrossingInputsChange,
  FenceLinesResponse,
  RealignmentView,
} from '../schemas/crossing-view';
import type { CostsView, SettingsView } from '../schemas/costs-view';
import type { DesignSettings } from '../schemas/crossing';
import type { PriceListItem } from '../schemas/price-list';
import type { Paddock, PaddocksFromFencesResult } from '../schemas/paddock';
import type { FenceLine, FenceLineInput } from '../schemas/plan';
import type { ElevationAtPoint } from '../schemas/queries';
import type { Track, TrackImportResult } from '../schemas/tracks';
import type { Invitation } from '../schemas/invitation';
import type { Member, PropertySummary } from '../schemas/property';
import type { ElevationModelView, TerrainRun } from '../schemas/terrain';
import type { CreateWorkOrderInput, ItemState, UpdateWorkOrderInput, WorkOrder, WorkOrderProgress, WorkOrderSheet } from '../schemas/work-order';
import type { CheckView, CrossingInspectionsView, PhotoView, RainEventView, RoundView } from '../schemas/inspection';
import type { CheckStatus } from '../crossings/inspection-statuses';

/** An error answer from the API, with the message and per-field problems it carried. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly fields: Record<string, string> = {},
  ) {
    super(message);
  }
}

async function request<T>(method: string, path: string, body?: unknown): Promise<T> {
  // A File goes as the raw body (an upload); anything else as JSON.
  const isFile = typeof File !== 'undefined' && body instanceof File;
  const response = await fetch(path, {
    method,
    credentials: 'same-origin',
    headers: body === undefined ? {} : { 'Content-Type': isFile ? body.type || 'application/octet-stream' : 'application/json' },
    body: body === undefined ? undefined : isFile ? body : JSON.stringify(body),
  });
  if (response.status === 204) return undefined as T;
  const data = (await response.json().catch(() => ({}))) as { error?: string; fields?: Record<string, string> };
  if (!response.ok) {
    throw new ApiError(response.status, data.error ?? `The server answered ${response.status}.`, data.fields);
  }
  return data as T;
}

/** The typed API client used by the islands (one function per endpoint). */
export const api = {
  listProperties: () => request<{ properties: PropertySummary[] }>('GET', '/api/properties'),
  createProperty: (input: { name: string; region: string; crs: string }) =>
    request<{ property: PropertySummary }>('POST', '/api/properties', input),
  describeCrs: (code: string) =>
    request<{ code: string; name: string; unit: string }>('GET', `/api/crs/${encodeURIComponent(code)}`),
  listMembers: (propertyId: number) => request<{ members: Member[] }>('GET', `/api/properties/${propertyId}/members`),
  changeRole: (propertyId: number, userId: number, role: Member['role']) =>
    request<{ member: Member }>('PATCH', `/api/properties/${propertyId}/members/${userId}`, { role }),
  removeMember: (propertyId: number, userId: number) =>
    request<void>('DELETE', `/api/properties/${propertyId}/members/${userId}`),
  listInvitations: (propertyId: number) => request<{ invitations: Invitation[] }>('GET', `/api/properties/${propertyId}/invitations`),
  /** Invites a person by e-mail; the e-mail with the accept link goes out through the outbox. */
  createInvitation: (propertyId: number, input: { email: string; role: Member['role'] }) =>
    request<{ invitation: Invitation }>('POST', `/api/properties/${propertyId}/invitations`, input),
  revokeInvitation: (propertyId: number, invitationId: number) =>
    request<void>('DELETE', `/api/properties/${propertyId}/invitations/${invitationId}`),
  acceptInvitation: (token: string) =>
    request<{ membership: { propertyId: number; role: Member['role'] } }>('POST', '/api/invitations/accept', { token }),
  listElevationModels: (propertyId: number) =>
    request<{ elevationModels: ElevationModelView[] }>('GET', `/api/properties/${propertyId}/elevation-models`),
  getTerrainRun: (propertyId: number, runId: number) =>
    request<{ run: TerrainRun }>('GET', `/api/properties/${propertyId}/terrain-runs/${runId}`),
  cancelTerrainRun: (propertyId: number, runId: number) =>
    request<{ run: TerrainRun }>('POST', `/api/properties/${propertyId}/terrain-runs/${runId}/cancel`),
  startTerrainRun: (propertyId: number, elevationModelId: number, thresholdHa?: number) =>
    request<{ run: TerrainRun }>('POST', `/api/properties/${propertyId}/terrain-runs`, { elevationModelId, thresholdHa }),
  listFenceLines: (propertyId: number) => request<FenceLinesResponse>('GET', `/api/properties/${propertyId}/fence-lines`),
  createFenceLine: (propertyId: number, input: Partial<FenceLineInput> & Pick<FenceLineInput, 'name' | 'coordinates'>) =>
    request<{ fenceLine: FenceLine }>('POST', `/api/properties/${propertyId}/fence-lines`, input),
  /** Changes a fence line; `version` is the one read (a 409 ApiError when someone changed it meanwhile). */
  updateFenceLine: (propertyId: number, fenceLineId: number, changes: Partial<FenceLineInput> & { version: number }) =>
    request<{ fenceLine: FenceLine }>('PATCH', `/api/properties/${propertyId}/fence-lines/${fenceLineId}`, changes),
  getFenceLine: (propertyId: number, fenceLineId: number) =>
    request<{ fenceLine: FenceLine }>('GET', `/api/properties/${propertyId}/fence-lines/${fenceLineId}`),
  /** Deletes a fence line; with `version` (the one read) a 409 ApiError when someone changed it meanwhile. */
  deleteFenceLine: (propertyId: number, fenceLineId: number, version?: number) =>
    request<void>('DELETE', `/api/properties/${propertyId}/fence-lines/${fenceLineId}${version === undefined ? '' : `?version=${version}`}`),
  listTracks: (propertyId: number) => request<{ tracks: Track[] }>('GET', `/api/properties/${propertyId}/tracks`),
  /** Sends a GPX or KML file: its lines become tracks, its polygons paddocks. */
  importTrackFile: (propertyId: number, file: File) =>
    request<{ imported: TrackImportResult }>('POST', `/api/properties/${propertyId}/tracks?name=${encodeURIComponent(file.name)}`, file),
  trackToFenceLine: (propertyId: number, trackId: number) =>
    request<{ fenceLine: FenceLine }>('POST', `/api/properties/${propertyId}/tracks/${trackId}/fence-line`),
  getPaddock: (propertyId: number, paddockId: number) => request<{ paddock: Paddock }>('GET', `/api/properties/${propertyId}/paddocks/${paddockId}`),
  /** The property's crossings as a GeoJSON FeatureCollection of Points. */
  listCrossings: (propertyId: number) => request<CrossingCollection>('GET', `/api/properties/${propertyId}/crossings`),
  getCrossing: (propertyId: number, crossingId: number) =>
    request<{ crossing: CrossingDetailView }>('GET', `/api/properties/${propertyId}/crossings/${crossingId}`),
  /** Sets (a value) or clears (null) a crossing's inputs; the answer is the crossing designed again. */
  setCrossingInputs: (propertyId: number, crossingId: number, changes: CrossingInputsChange) =>
    request<{ crossing: CrossingDetailView }>('PATCH', `/api/properties/${propertyId}/crossings/${crossingId}`, changes),
  getRealignment: (propertyId: number, crossingId: number) =>
    request<{ realignment: RealignmentView }>('GET', `/api/properties/${propertyId}/crossings/${crossingId}/realignment`),
  /** Accepts the previewed realignment; `version` is the fence line's version from the preview. */
  acceptRealignment: (propertyId: number, crossingId: number, version: number) =>
    request<{ fenceLine: FenceLine }>('POST', `/api/properties/${propertyId}/crossings/${crossingId}/realignment`, { version }),
  listPaddocks: (propertyId: number) => request<{ paddocks: Paddock[] }>('GET', `/api/properties/${propertyId}/paddocks`),
  /** `rings`: the outer ring then any holes, `[[lon, lat], …]`, closed or not. */
  createPaddock: (propertyId: number, input: { name: string; rings: [number, number][][] }) =>
    request<{ paddock: Paddock }>('POST', `/api/properties/${propertyId}/paddocks`, input),
  /** `version` is the paddock's version as read; a stale one is refused with 409. */
  updatePaddock: (propertyId: number, paddockId: number, changes: { name?: string; rings?: [number, number][][]; version: number }) =>
    request<{ paddock: Paddock }>('PATCH', `/api/properties/${propertyId}/paddocks/${paddockId}`, changes),
  /** Deletes a paddock; with `version` (the one read) a 409 ApiError when someone changed it meanwhile. */
  deletePaddock: (propertyId: number, paddockId: number, version?: number) =>
    request<void>('DELETE', `/api/properties/${propertyId}/paddocks/${paddockId}${version === undefined ? '' : `?version=${version}`}`),
  /** Makes paddocks of the areas the fence lines close off (by default every fence line not retired). */
  paddocksFromFences: (propertyId: number, fenceLineIds?: number[]) =>
    request<PaddocksFromFencesResult>('POST', `/api/properties/${propertyId}/paddocks/from-fences`, fenceLineIds ? { fenceLineIds } : {}),
  deleteTrack: (propertyId: number, trackId: number) => request<void>('DELETE', `/api/properties/${propertyId}/tracks/${trackId}`),
  /** Ground height at a point (throttle it when following the cursor); `elevationM` null off every model. */
  getSettings: (propertyId: number) => request<SettingsView>('GET', `/api/properties/${propertyId}/settings`),
  /** Changes the price list and design settings; `version` is the one read (a 409 ApiError when someone changed them meanwhile). */
  updateSettings: (propertyId: number, changes: { version: number; priceList?: PriceListItem[]; designSettings?: DesignSettings }) =>
    request<{ settings: SettingsView['settings'] }>('PATCH', `/api/properties/${propertyId}/settings`, changes),
  getCosts: (propertyId: number) => request<{ costs: CostsView }>('GET', `/api/properties/${propertyId}/costs`),
  elevationAt: (propertyId: number, [lon, lat]: [number, number]) =>
    request<ElevationAtPoint>('GET', `/api/properties/${propertyId}/elevation?${new URLSearchParams({ lon: String(lon), lat: String(lat) })}`),
  listRainEvents: (propertyId: number) => request<{ rainEvents: RainEventView[] }>('GET', `/api/properties/${propertyId}/rain-events`),
  /** Records a rain event; the answer is the inspection round it opened. */
  recordRainEvent: (propertyId: number, input: { fellOn: string; rainfallMm: number; scope: 'property' | 'paddocks'; paddockIds: number[]; note: string }) =>
    request<{ round: RoundView }>('POST', `/api/properties/${propertyId}/rain-events`, input),
  getRound: (propertyId: number, roundId: number) => request<{ round: RoundView }>('GET', `/api/properties/${propertyId}/inspection-rounds/${roundId}`),
  updateRound: (propertyId: number, roundId: number, input: { status: 'open' | 'closed'; version: number }) =>
    request<{ round: RoundView }>('PATCH', `/api/properties/${propertyId}/inspection-rounds/${roundId}`, input),
  /** Records a crossing's status and note; `version` is the one read (a 409 ApiError when someone recorded it meanwhile). */
  updateCheck: (propertyId: number, roundId: number, checkId: number, input: { status: CheckStatus; note: string; version: number }) =>
    request<{ check: CheckView }>('PATCH', `/api/properties/${propertyId}/inspection-rounds/${roundId}/checks/${checkId}`, input),
  removePhoto: (propertyId: number, photoId: number) => request<void>('DELETE', `/api/properties/${propertyId}/photos/${photoId}`),
  crossingInspections: (propertyId: number, crossingId: number) =>
    request<{ inspections: CrossingInspectionsView }>('GET', `/api/properties/${propertyId}/crossings/${crossingId}/inspections`),
};

export type UploadedElevationModel = { elevationModel: ElevationModelView; run: TerrainRun; warnings: string[] };

/**
 * Sends an elevation model file as the request body, reporting upload progress (fetch cannot,
 * so this one call uses XMLHttpRequest). Rejects with an ApiError carrying the server's message.
 */
export function uploadElevationModel(
  propertyId: number,
  file: File,
  options: { crs?: string; thresholdHa?: number; onProgress: (fraction: number) => void },
): Promise<UploadedElevationModel> {
  const query = new URLSearchParams({ name: file.name });
  if (options.crs) query.set('crs', options.crs);
  if (options.thresholdHa !== undefined) query.set('thresholdHa', String(options.thresholdHa));
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', `/api/properties/${propertyId}/elevation-models?${query}`);
    xhr.setRequestHeader('Content-Type', 'image/tiff');
    xhr.upload.onprogress = (event) => event.lengthComputable && options.onProgress(event.loaded / event.total);
    xhr.onerror = () => reject(new ApiError(0, 'The upload was interrupted. Check your connection and try again.'));
    xhr.onload = () => {
      const data = (() => {
        try {
          return JSON.parse(xhr.responseText) as Record<string, unknown>;
        } catch {
          return {};
        }
      })();
      if (xhr.status === 201) resolve(data as UploadedElevationModel);
      else reject(new ApiError(xhr.status, (data.error as string) ?? `The server answered ${xhr.status}.`, (data.fields as Record<string, string>) ?? {}));
    };
    xhr.send(file);
  });
}

export type PlanExportKind = 'geojson' | 'kml' | 'gpx';

const EXPORT_FILES: Record<PlanExportKind, string> = { geojson: 'plan.geojson', kml: 'plan.kml', gpx: 'waypoints.gpx' };

/** The download address of the plan as GeoJSON or KML, or of the crossings' waypoints as GPX (for a link's href). */
export function exportUrl(propertyId: number, kind: PlanExportKind): string {
  return `/api/properties/${propertyId}/exports/${EXPORT_FILES[kind]}`;
}

/** What `POST /api/properties/:id/plan-import` answers. */
export type ImportedPlanView = {
  format: 'geojson' | 'kml';
  fenceLines: number;
  paddocks: number;
  fenceLineIds: number[];
  paddockIds: number[];
  derivedSkipped: number;
  unrecognised: number;
};

/**
 * Sends a plan file exported from Gullyline (GeoJSON or KML) to a property; its fence lines and
 * paddocks are added, all or nothing. Rejects with an ApiError carrying the server's reason.
 */
export async function importPlan(propertyId: number, file: File): Promise<{ imported: ImportedPlanView }> {
  const response = await fetch(`/api/properties/${propertyId}/plan-import?${new URLSearchParams({ name: file.name })}`, {
    method: 'POST',
    credentials: 'same-origin',
    // The server tells GeoJSON from KML by the content; the type only keeps the upload out of the JSON body limit.
    headers: { 'Content-Type': file.type && !/^application\/json\b/i.test(file.type) ? file.type : 'application/octet-stream' },
    body: file,
  });
  const data = (await response.json().catch(() => ({}))) as { imported?: ImportedPlanView; error?: string; fields?: Record<string, string> };
  if (response.status !== 201 || !data.imported) throw new ApiError(response.status, data.error ?? `The server answered ${response.status}.`, data.fields);
  return { imported: data.imported };
}

/** The work order calls of the work orders page and the crew view. */
export const workOrderApi = {
  list: (propertyId: number) => request<{ workOrders: WorkOrder[] }>('GET', `/api/properties/${propertyId}/work-orders`),
  create: (propertyId: number, input: Partial<CreateWorkOrderInput>) => request<{ workOrder: WorkOrder }>('POST', `/api/properties/${propertyId}/work-orders`, input),
  get: (propertyId: number, orderId: number) => request<{ workOrder: WorkOrderSheet }>('GET', `/api/properties/${propertyId}/work-orders/${orderId}`),
  update: (propertyId: number, orderId: number, changes: UpdateWorkOrderInput) =>
    request<{ workOrder: WorkOrder }>('PATCH', `/api/properties/${propertyId}/work-orders/${orderId}`, changes),
  remove: (propertyId: number, orderId: number) => request<void>('DELETE', `/api/properties/${propertyId}/work-orders/${orderId}`),
  send: (propertyId: number, orderId: number, version: number) => request<{ workOrder: WorkOrder }>('POST', `/api/properties/${propertyId}/work-orders/${orderId}/send`, { version }),
  setItemState: (propertyId: number, orderId: number, itemId: number, input: { state: ItemState; note: string }) =>
    request<{ workOrder: WorkOrder }>('PATCH', `/api/properties/${propertyId}/work-orders/${orderId}/items/${itemId}`, input),
  propertyProgress: (propertyId: number) =>
    request<{ orders: { id: number; title: string; status: string; progress: WorkOrderProgress }[]; live: WorkOrderProgress; byStatus: Record<string, number> }>(
      'GET',
      `/api/properties/${propertyId}/work-orders/progress`,
    ),
};
/** Sends a photo of a check as a form upload; the server checks it is a photo and strips its metadata unless `keepLocation`. */
export async function uploadPhoto(propertyId: number, checkId: number, file: File, keepLocation: boolean): Promise<{ photo: PhotoView }> {
  const form = new FormData();
  form.set('checkId', String(checkId));
  form.set('keepLocation', keepLocation ? 'true' : 'false');
  form.set('photo', file);
  const response = await fetch(`/api/properties/${propertyId}/photos`, { method: 'POST', credentials: 'same-origin', body: form });
  const data = (await response.json().catch(() => ({}))) as { photo?: PhotoView; error?: string; fields?: Record<string, string> };
  if (response.status !== 201 || !data.photo) throw new ApiError(response.status, data.error ?? `The server answered ${response.status}.`, data.fields);
  return { photo: data.photo };
}
