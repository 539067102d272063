/// <reference types="astro/client" />

declare namespace App {
  interface Locals {
    user: import('./lib/http/handle').Caller | null;
    sessionId: string | null;
    /** Set by scripts/serve.mjs: waits until the client's connection has room (streamed exports heed it). */
    room?: import('./lib/http/text-stream').Room;
  }
}

declare module 'shpjs';
