/**
 * The part of yazl 3.3.1 (MIT; ships no types) that Lagbook uses: a zip written as a stream,
 * entries added from buffers and lazily opened read streams. See node_modules/yazl/README.md.
 */
declare module 'yazl' {
  import type { EventEmitter } from 'node:events';
  import type { Readable } from 'node:stream';

  interface EntryOptions {
    mtime?: Date;
    mode?: number;
    compress?: boolean;
    compressionLevel?: number;
  }

  export class ZipFile extends EventEmitter {
    /** The zip's bytes, produced as entries are added and pumped in order. */
    readonly outputStream: Readable;
    addBuffer(buffer: Buffer, metadataPath: string, options?: EntryOptions): void;
    /** `getReadStream` is called only when the entry's turn comes, so one stream is open at a time. */
    addReadStreamLazy(metadataPath: string, options: EntryOptions | null, getReadStream: (cb: (err: Error | null, stream?: Readable) => void) => void): void;
    end(options?: { comment?: string }): void;
  }
}
