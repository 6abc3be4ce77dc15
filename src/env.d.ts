/// <reference types="astro/client" />

declare namespace App {
  interface Locals {
    /** The signed-in person as the session says (null when signed out); set by the middleware. */
    user: import('./lib/server/authorise').SessionUser | null;
    /** A small JSON body the production server read ahead (scripts/serve.mjs); read it through lib/server/http.ts. */
    bodyText?: string;
  }
}
