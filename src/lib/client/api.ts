import type { Member, PropertySummary } from '../schemas/property';

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
  const response = await fetch(path, {
    method,
    credentials: 'same-origin',
    headers: body === undefined ? {} : { 'Content-Type': 'application/json' },
    body: body === undefined ? undefined : JSON.stringify(body),
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
};
