import { z } from 'zod';
import { emailSchema } from './account';
import { roleSchema } from './property';
import type { MailDelivery } from './mail-delivery';
import type { Role } from './roles';

export const createInvitationSchema = z.object({
  email: z.string({ required_error: 'Enter the e-mail address of the person to invite.' }).pipe(emailSchema),
  role: roleSchema,
});
export type CreateInvitationInput = z.infer<typeof createInvitationSchema>;

export const acceptInvitationSchema = z.object({
  token: z.string({ required_error: 'The invitation link is incomplete.' }).trim().min(20, 'The invitation link is incomplete.').max(100, 'The invitation link is not valid.'),
});

/** A pending invitation as owners and managers see it (never the token). */
export type Invitation = {
  id: number;
  email: string;
  role: Role;
  invitedByName: string | null;
  createdAt: string;
  expiresAt: string;
  expired: boolean;
  /** The invitation e-mail's delivery, or null when its outbox entry is gone. */
  mail: MailDelivery | null;
};
