import { mkdir, readFile, rename, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { z } from 'zod';
import { storedMessageSchema, type StoredMessage } from '../../lib/mail/message';

/** Only the newest messages are kept, so a long-running dev sink cannot grow without bound. */
export const MAILBOX_CAP = 500;

const storeFileSchema = z.object({ version: z.literal(1), messages: z.array(storedMessageSchema) });

/**
 * The sink's messages, newest first, optionally persisted to one JSON file.
 * Every change rewrites the file through a temporary file and a rename, so a crash mid-write
 * leaves either the old file or the new one, never half of one. Writes are chained so two
 * messages arriving together cannot overtake each other on disk.
 */
export class MessageStore {
  private messages: StoredMessage[] = [];
  private writing: Promise<void> = Promise.resolve();

  constructor(
    readonly file: string | null,
    private readonly log: (line: string) => void = () => {},
  ) {}

  /** Reads the store file if there is one. A missing file is an empty mailbox; an unreadable one is set aside. */
  async load(): Promise<void> {
    if (!this.file) return;
    let raw: string;
    try {
      raw = await readFile(this.file, 'utf8');
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code === 'ENOENT') return;
      throw err;
    }
    try {
      const parsed = storeFileSchema.parse(JSON.parse(raw));
      this.messages = parsed.messages.slice(0, MAILBOX_CAP);
    } catch {
      // Keep the bad file for a human to look at rather than silently overwriting it.
      const aside = `${this.file}.unreadable-${Date.now()}`;
      await rename(this.file, aside);
      this.log(`smtp sink: ${this.file} was unreadable; moved it to ${aside} and started empty`);
    }
  }

  async add(message: StoredMessage): Promise<void> {
    this.messages.unshift(message);
    if (this.messages.length > MAILBOX_CAP) this.messages.length = MAILBOX_CAP;
    await this.persist();
  }

  async clear(): Promise<void> {
    this.messages = [];
    await this.persist();
  }

  /** Newest first; `to` matches any recipient address, ignoring case. */
  list(to?: string): StoredMessage[] {
    if (!to) return [...this.messages];
    const wanted = to.trim().toLowerCase();
    return this.messages.filter((m) => m.to.some((addr) => addr.toLowerCase() === wanted));
  }

  get(id: string): StoredMessage | undefined {
    return this.messages.find((m) => m.id === id);
  }

  /** Resolves once everything changed so far is on disk. */
  flushed(): Promise<void> {
    return this.writing;
  }

  private persist(): Promise<void> {
    const file = this.file;
    if (!file) return Promise.resolve();
    // Snapshot now, so the file reflects the state at the time of this change.
    const body = JSON.stringify({ version: 1, messages: this.messages });
    const next = this.writing.then(async () => {
      await mkdir(path.dirname(file), { recursive: true });
      const tmp = `${file}.${process.pid}.tmp`;
      await writeFile(tmp, body, 'utf8');
      await rename(tmp, file);
    });
    // A failed write must not wedge every later one; the caller still sees this one's error.
    this.writing = next.catch((err) => this.log(`smtp sink: could not write ${file}: ${String(err)}`));
    return next;
  }
}
