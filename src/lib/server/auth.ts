import { hasRole, type Role } from '../schemas/roles';
import type { SessionUser } from '../../env';
import { ForbiddenError, NotFoundError, UnauthorizedError, parseId } from './http';
import { findRole } from './repos/memberships';

export type PropertyAccess = { user: SessionUser; propertyId: number; role: Role };

/** @throws UnauthorizedError for an anonymous caller */
export function requireUser(locals: App.Locals): SessionUser {
  if (!locals.user) throw new UnauthorizedError();
  return locals.user;
}

/**
 * The one gate for everything that touches a property. A caller who is not a member gets
 * 404, as if the property did not exist; a member below `minimum` gets 403.
 * @throws UnauthorizedError, NotFoundError, ForbiddenError
 */
export async function requireRole(locals: App.Locals, propertyId: string | number | undefined, minimum: Role): Promise<PropertyAccess> {
  const user = requireUser(locals);
  const id = typeof propertyId === 'number' ? propertyId : parseId(propertyId, 'property');
  const role = await findRole(id, user.id);
  if (!role) throw new NotFoundError('property');
  if (!hasRole(role, minimum)) {
    throw new ForbiddenError(`This needs the ${minimum} role or higher on this property; you are ${article(role)} ${role}.`);
  }
  return { user, propertyId: id, role };
}

function article(role: Role): string {
  return role === 'owner' ? 'an' : 'a';
}
