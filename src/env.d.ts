/// <reference types="astro/client" />

export type SessionUser = { id: number; email: string; name: string };

declare global {
  namespace App {
    interface Locals {
      /** The signed-in user, or null for an anonymous visitor (set by src/middleware.ts). */
      user: SessionUser | null;
      /** Why a page was refused (a 403), for the not-allowed page a refusal is rewritten to. */
      refusal?: string;
    }
  }
}
