/// <reference types="astro/client" />

declare namespace App {
  interface Locals {
    /** The signed-in person, or null for visitors. */
    user: import('lucia').User & { email: string; name: string } | null;
    /** The lucia session behind the cookie, or null. */
    session: import('lucia').Session | null;
    /** The studio this request acts in and the user's roles there; null for visitors and people with no studio. */
    studio: import('./server/services/accounts').StudioAccess | null;
    /** Every studio the person belongs to (the switcher lists them). */
    studios: import('./server/services/accounts').StudioAccess[];
    /** The studio a `/s/{slug}/…` address names (visitors too), or null elsewhere. */
    pageStudio: import('./server/services/studio-identity').PublicStudio | null;
  }
}
