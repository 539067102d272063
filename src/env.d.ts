/// <reference types="astro/client" />

declare namespace App {
  interface Locals {
    user: import('./lib/http/handle').Caller | null;
    sessionId: string | null;
  }
}

declare module 'shpjs';
