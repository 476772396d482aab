/** The part of cli-progress (3.x) that the sweep progress line uses; the package ships no types. */
declare module 'cli-progress' {
  import type { Writable } from 'node:stream';

  export interface Options {
    format?: string;
    stream?: Writable;
    fps?: number;
    etaBuffer?: number;
    etaAsynchronousUpdate?: boolean;
    hideCursor?: boolean | null;
    clearOnComplete?: boolean;
    stopOnComplete?: boolean;
    barsize?: number;
    noTTYOutput?: boolean;
    barCompleteChar?: string;
    barIncompleteChar?: string;
  }

  export class SingleBar {
    constructor(options: Options, preset?: object);
    start(total: number, startValue: number, payload?: Record<string, unknown>): void;
    update(current: number, payload?: Record<string, unknown>): void;
    stop(): void;
  }

  export const Presets: { readonly shades_classic: object; readonly legacy: object; readonly rect: object };
}
