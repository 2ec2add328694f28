// archiver@8 ships no types: the little of ZipArchive this project uses.
declare module 'archiver' {
  import type { Readable, Transform } from 'node:stream';

  export interface EntryData {
    name: string;
    date?: Date;
  }

  export class ZipArchive extends Transform {
    constructor(options?: { zlib?: { level?: number }; forceZip64?: boolean });
    append(source: Readable | Buffer | string, data: EntryData): this;
    file(path: string, data: EntryData): this;
    finalize(): Promise<void>;
    pointer(): number;
  }
}
