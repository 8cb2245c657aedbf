// Files as the server sees them: URIs from the client, paths for the core, and one reader that serves open
// documents before the disk. Texts read from disk are kept by (size, mtime), so a header reached by every
// keystroke's analysis is read once per version, and the same text maps a fix's offsets to positions later.
import * as fs from 'node:fs';
import * as path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { TextDocument } from 'vscode-languageserver-textdocument';

/** The core names files by absolute path (as the CLI does); other schemes keep their URI string. */
export function corePathOf(uri: string): string {
  if (!uri.startsWith('file:')) return uri;
  try {
    return fileURLToPath(uri);
  } catch {
    return uri;
  }
}

export function isUriString(text: string): boolean {
  return /^[a-z][a-z0-9+.-]+:/i.test(text) && !/^[a-z]:[\\/]/i.test(text);
}

/** Open documents by URI, as the client spelled it, and by the core's path. */
export interface OpenDocuments {
  get(uri: string): TextDocument | undefined;
  all(): TextDocument[];
}

interface DiskText {
  size: number;
  mtimeMs: number;
  text: string;
  mapped?: TextDocument;
}

export class FileReader {
  private readonly disk = new Map<string, DiskText>();
  private readonly byPath = new Map<string, string>();

  constructor(private readonly documents: OpenDocuments) {}

  /** Records an open document's path, so the core's path finds the client's URI. */
  opened(doc: TextDocument): void {
    this.byPath.set(corePathOf(doc.uri), doc.uri);
  }

  closed(uri: string): void {
    this.byPath.delete(corePathOf(uri));
  }

  /** The client's URI of a core path: the open document's spelling, else a file URL. */
  uriOf(corePath: string): string {
    return this.byPath.get(corePath) ?? (isUriString(corePath) ? corePath : pathToFileURL(corePath).href);
  }

  openDocument(corePath: string): TextDocument | undefined {
    const uri = this.byPath.get(corePath);
    return uri === undefined ? undefined : this.documents.get(uri);
  }

  /** Drops what is known of a file on disk (a watched-files event). */
  forget(corePath: string): void {
    this.disk.delete(corePath);
  }

  /** The reader the core gets: an open buffer first, else the disk; undefined above the limit (UTF-8 bytes). */
  read(corePath: string, maxBytes: number): string | undefined {
    const open = this.openDocument(corePath);
    if (open) {
      const text = open.getText();
      return Buffer.byteLength(text, 'utf8') > maxBytes ? undefined : text;
    }
    const known = this.fromDisk(corePath, maxBytes);
    return known === undefined || known.size > maxBytes ? undefined : known.text;
  }

  /** An open buffer's version, else the size and time on disk: what the core's header cache keys on. */
  versionOf(corePath: string): string | undefined {
    const open = this.openDocument(corePath);
    if (open) return `open:${open.version}`;
    if (isUriString(corePath)) return undefined;
    try {
      const stat = fs.statSync(corePath);
      return `${stat.size}:${stat.mtimeMs}`;
    } catch {
      return undefined;
    }
  }

  /** Offsets to positions in a file the analysis read: the open buffer, else the text last read from disk. */
  mapperOf(corePath: string): TextDocument | undefined {
    const open = this.openDocument(corePath);
    if (open) return open;
    const known = this.disk.get(corePath) ?? this.fromDisk(corePath);
    if (!known) return undefined;
    known.mapped ??= TextDocument.create(this.uriOf(corePath), 'plaintext', 0, known.text);
    return known.mapped;
  }

  /** A file above `maxBytes` is not read: its size alone is returned. */
  private fromDisk(corePath: string, maxBytes = Infinity): DiskText | undefined {
    if (isUriString(corePath)) return undefined;
    let stat: fs.Stats;
    try {
      stat = fs.statSync(corePath);
    } catch {
      this.disk.delete(corePath);
      return undefined;
    }
    if (!stat.isFile()) return undefined;
    const known = this.disk.get(corePath);
    if (known && known.size === stat.size && known.mtimeMs === stat.mtimeMs) return known;
    if (stat.size > maxBytes) return { size: stat.size, mtimeMs: stat.mtimeMs, text: '' };
    try {
      const fresh: DiskText = { size: stat.size, mtimeMs: stat.mtimeMs, text: fs.readFileSync(corePath, 'utf8') };
      this.disk.set(corePath, fresh);
      return fresh;
    } catch {
      this.disk.delete(corePath);
      return undefined;
    }
  }
}

export function realpathOrUndefined(file: string): string | undefined {
  try {
    return fs.realpathSync(file);
  } catch {
    return undefined;
  }
}

/** The workspace folder holding a path (the longest match), else the first folder. */
export function folderOf(corePath: string, roots: readonly string[]): string | undefined {
  const holding = roots.filter((root) => {
    const rel = path.relative(root, corePath);
    return rel === '' || (!rel.startsWith('..') && !path.isAbsolute(rel));
  });
  return holding.sort((a, b) => b.length - a.length)[0] ?? roots[0];
}
