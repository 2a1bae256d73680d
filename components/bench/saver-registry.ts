/**
 * One autosaver per photo for as long as the Bench is open (and after, while a save is still
 * owed): switching photos never drops an edit that could not be saved yet — it keeps retrying in
 * the background and is shown again when the person comes back to that photo.
 */
import { RegionAutosaver, type SendResult, type ServerSet, type SaveRequest } from "./region-autosaver";

export class SaverRegistry {
  private savers = new Map<string, RegionAutosaver>();
  private unsubscribers = new Map<string, () => void>();
  private listeners = new Set<() => void>();
  private unsavedKey = "";

  constructor(
    private readonly send: (photoId: string, request: SaveRequest) => Promise<SendResult>,
    private readonly onSaved: (photoId: string, set: ServerSet) => void = () => {},
  ) {}

  get(photoId: string): RegionAutosaver | undefined {
    return this.savers.get(photoId);
  }

  /** A saver starting from the server's `set`; an older saver of the photo (with nothing owed) is replaced. */
  open(photoId: string, set: ServerSet): RegionAutosaver {
    const old = this.savers.get(photoId);
    if (old?.hasUnsaved()) return old;
    old?.dispose();
    this.unsubscribers.get(photoId)?.();
    const saver = new RegionAutosaver({ initial: set, send: (request) => this.send(photoId, request), onSaved: (saved) => this.onSaved(photoId, saved) });
    this.savers.set(photoId, saver);
    this.unsubscribers.set(
      photoId,
      saver.subscribe(() => this.changed()),
    );
    this.changed();
    return saver;
  }

  /** Photos whose edits are not on the server yet, joined into one string (a stable snapshot). */
  unsavedPhotoIds = (): string => this.unsavedKey;

  anyUnsaved(): boolean {
    return [...this.savers.values()].some((s) => s.hasUnsaved());
  }

  /** Saves everything owed now; true when all of it is saved. */
  async flushAll(): Promise<boolean> {
    const results = await Promise.all([...this.savers.values()].map((s) => s.flush()));
    return results.every(Boolean);
  }

  /** The connection is back: every saver waiting to retry tries now. */
  retryAll(): void {
    for (const saver of this.savers.values()) saver.retryNow();
  }

  subscribe = (listener: () => void): (() => void) => {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  };

  private changed(): void {
    const key = [...this.savers.entries()]
      .filter(([, s]) => s.hasUnsaved())
      .map(([id]) => id)
      .sort()
      .join(" ");
    if (key === this.unsavedKey) return;
    this.unsavedKey = key;
    for (const listener of this.listeners) listener();
  }
}
