/** A file chosen for upload, with its path on the card. */
export interface CardFile {
  file: File;
  cardPath: string;
}

/**
 * The path on the card starts at DCIM when the folder holds one (a whole card was chosen);
 * otherwise it is the path as chosen. Hidden files (a laptop's own index files) are left out.
 */
export function toCardFiles(entries: Array<{ file: File; path: string }>): CardFile[] {
  const result: CardFile[] = [];
  for (const { file, path } of entries) {
    const clean = path.replace(/\\/g, '/').replace(/^\/+/, '');
    const parts = clean.split('/');
    if (parts.some((part) => part.startsWith('.')) || file.size === 0) continue;
    const dcim = parts.findIndex((part) => part.toUpperCase() === 'DCIM');
    result.push({ file, cardPath: dcim >= 0 ? parts.slice(dcim).join('/') : clean });
  }
  return result;
}

/** Files from an <input type=file> (webkitdirectory keeps each file's relative path). */
export function filesFromInput(list: FileList): CardFile[] {
  return toCardFiles(
    Array.from(list, (file) => ({ file, path: file.webkitRelativePath || file.name })),
  );
}

/** Files and folders dropped on the page, walked recursively. */
export async function filesFromDrop(items: DataTransferItemList): Promise<CardFile[]> {
  const entries = Array.from(items)
    .map((item) => item.webkitGetAsEntry())
    .filter((entry): entry is FileSystemEntry => entry !== null);
  const found: Array<{ file: File; path: string }> = [];
  async function walk(entry: FileSystemEntry): Promise<void> {
    if (entry.isFile) {
      const file = await new Promise<File>((resolve, reject) =>
        (entry as FileSystemFileEntry).file(resolve, reject),
      );
      found.push({ file, path: entry.fullPath });
      return;
    }
    const reader = (entry as FileSystemDirectoryEntry).createReader();
    // readEntries answers in batches: keep asking until it returns none.
    for (;;) {
      const batch = await new Promise<FileSystemEntry[]>((resolve, reject) =>
        reader.readEntries(resolve, reject),
      );
      if (batch.length === 0) return;
      for (const child of batch) await walk(child);
    }
  }
  for (const entry of entries) await walk(entry);
  return toCardFiles(found);
}
