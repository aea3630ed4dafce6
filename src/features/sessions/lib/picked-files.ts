// Files picked one by one, as a card folder, or dropped (files and whole folders alike).

export interface PickedFile {
  file: File;
  /** Path inside the picked folder ("DCIM/100FERN/FRN_0001.JPG"), else the file name. */
  path: string;
}

/** Hidden entries a system leaves on a card (".Trashes", "._FRN_0001.JPG") are not the photographer's files. */
const isHidden = (path: string) => path.split('/').some((part) => part.startsWith('.'));

export function splitHidden(files: PickedFile[]): { kept: PickedFile[]; hiddenCount: number } {
  const kept = files.filter((f) => !isHidden(f.path));
  return { kept, hiddenCount: files.length - kept.length };
}

export function fromFileList(list: FileList | null): PickedFile[] {
  return Array.from(list ?? [], (file) => ({ file, path: file.webkitRelativePath || file.name }));
}

function readAllEntries(reader: FileSystemDirectoryReader): Promise<FileSystemEntry[]> {
  // readEntries answers in chunks (about 100 at a time) until it answers an empty list.
  return new Promise((resolve, reject) => {
    const all: FileSystemEntry[] = [];
    const next = () => reader.readEntries((batch) => {
      if (batch.length === 0) return resolve(all);
      all.push(...batch);
      next();
    }, reject);
    next();
  });
}

async function walk(entry: FileSystemEntry, prefix: string, out: PickedFile[]): Promise<void> {
  const path = prefix ? `${prefix}/${entry.name}` : entry.name;
  if (entry.isFile) {
    const file = await new Promise<File>((resolve, reject) => (entry as FileSystemFileEntry).file(resolve, reject));
    out.push({ file, path });
  } else if (entry.isDirectory) {
    for (const child of await readAllEntries((entry as FileSystemDirectoryEntry).createReader())) await walk(child, path, out);
  }
}

/** Everything dropped, folders walked to their files. */
export async function fromDrop(data: DataTransfer): Promise<PickedFile[]> {
  const entries = Array.from(data.items, (item) => (item.kind === 'file' ? item.webkitGetAsEntry() : null)).filter((e): e is FileSystemEntry => !!e);
  if (entries.length === 0) return fromFileList(data.files);
  const out: PickedFile[] = [];
  for (const entry of entries) await walk(entry, '', out);
  return out;
}
