import { once } from 'node:events';
import type { Readable, Writable } from 'node:stream';
import { ZipArchive } from 'archiver';

/**
 * Writes a ZIP while it streams out: small text entries first, then each file opened only when
 * its turn comes (so a set of thousands keeps one file open and memory flat). Stored, not
 * deflated: JPEGs do not compress. archiver switches to ZIP64 by itself past 4 GB.
 */
export async function streamZip(
  out: Writable,
  texts: Array<{ name: string; content: string }>,
  files: Array<{ name: string; open: () => Promise<Readable> }>,
) {
  const archive = new ZipArchive({ zlib: { level: 0 } });
  const failed = new Promise<never>((_resolve, reject) => archive.once('error', reject));
  archive.pipe(out);
  for (const text of texts) {
    archive.append(text.content, { name: text.name });
    await Promise.race([once(archive, 'entry'), failed]);
  }
  for (const file of files) {
    archive.append(await file.open(), { name: file.name });
    await Promise.race([once(archive, 'entry'), failed]);
  }
  await Promise.race([archive.finalize(), failed]);
}
