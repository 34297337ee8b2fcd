/**
 * Analysis results per document, keyed by (uri, version, settings generation). Only the newest
 * version of a document is kept: an edit makes the older result useless, and hovers or code actions
 * always ask about the version the editor shows.
 */
export class ModelCache<T> {
  private readonly entries = new Map<string, { readonly version: number; readonly generation: number; readonly value: T }>();

  /** The value stored for exactly this version and settings generation, if any. */
  get(uri: string, version: number, generation: number): T | undefined {
    const entry = this.entries.get(uri);
    return entry && entry.version === version && entry.generation === generation ? entry.value : undefined;
  }

  /** Stores a value unless a newer version of the document is already stored. */
  set(uri: string, version: number, generation: number, value: T): void {
    const entry = this.entries.get(uri);
    if (entry && (entry.version > version || (entry.version === version && entry.generation > generation))) return;
    this.entries.set(uri, { version, generation, value });
  }

  delete(uri: string): void {
    this.entries.delete(uri);
  }

  clear(): void {
    this.entries.clear();
  }

  get size(): number {
    return this.entries.size;
  }
}
