import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { createServer, type Server, type Socket } from 'node:net';
import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { startSmtpSink, type SmtpSink } from '@/fakes/smtp/sink';
import { MAILBOX_CAP, MessageStore } from '@/fakes/smtp/store';
import { closeMailTransports, mailConfigFromEnv, sendMail } from '@/lib/mail/send';
import { clearMessages, getMessage, listMessages, waitForMessage } from '@/lib/mail/mailbox';
import { extractLinks } from '@/lib/mail/links';
import { InvalidError, UnavailableError } from '@/lib/errors';

// The local mail path end to end over real sockets: nodemailer → SMTP sink → JSON API → reader.
// No PostgreSQL involved.

let dir: string;
let storeFile: string;
let sink: SmtpSink;
const logLines: string[] = [];
// This file points the mail settings at its own sink; put back what the run had (scripts/test.sh sets them).
const savedEnv = {
  SMTP_HOST: process.env.SMTP_HOST,
  SMTP_PORT: process.env.SMTP_PORT,
  MAILBOX_URL: process.env.MAILBOX_URL,
};

async function startSink(ports = { smtpPort: 0, httpPort: 0 }): Promise<SmtpSink> {
  const started = await startSmtpSink({
    ...ports,
    host: '127.0.0.1',
    storeFile,
    log: (l) => logLines.push(l),
  });
  process.env.SMTP_HOST = started.host;
  process.env.SMTP_PORT = String(started.smtpPort);
  process.env.MAILBOX_URL = started.url;
  return started;
}

/** A port that nothing listens on: bind one, note it, release it. */
async function closedPort(): Promise<number> {
  const probe = createServer();
  await new Promise<void>((resolve) => probe.listen(0, '127.0.0.1', resolve));
  const port = (probe.address() as { port: number }).port;
  await new Promise<void>((resolve) => probe.close(() => resolve()));
  return port;
}

const SIGN_IN = 'http://127.0.0.1:3000/auth/link?token=k7Qm2x&email=ada%40quillmere.test';

beforeAll(async () => {
  dir = await mkdtemp(path.join(tmpdir(), 'ohm-mail-'));
  storeFile = path.join(dir, 'mailbox.json');
  sink = await startSink();
});

afterAll(async () => {
  closeMailTransports();
  await sink?.close();
  await rm(dir, { recursive: true, force: true });
  for (const [key, value] of Object.entries(savedEnv)) {
    if (value === undefined) delete process.env[key];
    else process.env[key] = value;
  }
});

describe('SMTP sink over real sockets', () => {
  test('listens on the free ports it was given and answers /health', async () => {
    expect(sink.smtpPort).toBeGreaterThan(0);
    expect(sink.httpPort).toBeGreaterThan(0);
    expect(sink.smtpPort).not.toBe(sink.httpPort);
    const res = await fetch(`${sink.url}/health`);
    expect(res.status).toBe(200);
    expect(await res.json()).toMatchObject({ ok: true });
  });

  test('a sent message arrives with subject, recipient and the link intact in text and HTML', async () => {
    const sent = await sendMail({
      to: 'ada@quillmere.test',
      subject: 'Your Ohmstead sign-in link',
      text: `Open this link to sign in:\n${SIGN_IN}\nIt works once.`,
      html: `<p>Open <a href="${SIGN_IN.replace(/&/g, '&amp;')}">this link</a> to sign in.</p>`,
    });
    expect(sent.accepted).toEqual(['ada@quillmere.test']);

    const [message] = await listMessages({ to: 'ada@quillmere.test' });
    expect(message).toBeDefined();
    expect(message.subject).toBe('Your Ohmstead sign-in link');
    expect(message.to).toEqual(['ada@quillmere.test']);
    expect(message.from).toContain('bench@ohmstead.invalid');
    expect(message.messageId).toBe(sent.messageId);
    expect(message.text).toContain(SIGN_IN);
    expect(message.html).toContain(`href="${SIGN_IN.replace(/&/g, '&amp;')}"`);
    // Both parts yield the same, decoded link: one entry after de-duplication.
    expect(extractLinks(message)).toEqual([SIGN_IN]);
    expect(logLines.some((l) => l.includes(message.id) && l.includes('ada@quillmere.test'))).toBe(true);

    const fetched = await getMessage(message.id);
    expect(fetched).toEqual(message);
  });

  test('lists newest first and filters by recipient, ignoring case', async () => {
    await sendMail({ to: 'bo@quillmere.test', subject: 'first for Bo', text: 'one' });
    await sendMail({ to: ['Bo@Quillmere.test', 'cy@fernwick.test'], subject: 'second for Bo', text: 'two' });

    const forBo = await listMessages({ to: 'bo@quillmere.test' });
    expect(forBo.map((m) => m.subject)).toEqual(['second for Bo', 'first for Bo']);
    const forCy = await listMessages({ to: 'CY@fernwick.test' });
    expect(forCy.map((m) => m.subject)).toEqual(['second for Bo']);

    const all = await listMessages();
    expect(all.length).toBe(3);
    const times = all.map((m) => Date.parse(m.receivedAt));
    expect([...times].sort((a, b) => b - a)).toEqual(times);
  });

  test('an unknown id is null, and unknown paths answer 404 JSON', async () => {
    expect(await getMessage('no-such-message')).toBeNull();
    const res = await fetch(`${sink.url}/nothing-here`);
    expect(res.status).toBe(404);
    expect(await res.json()).toMatchObject({ error: { code: 'not_found' } });
    const put = await fetch(`${sink.url}/messages`, { method: 'PUT' });
    expect(put.status).toBe(405);
  });

  test('waitForMessage finds a message that arrives a little later', async () => {
    const later = setTimeout(() => {
      void sendMail({ to: 'di@quillmere.test', subject: 'Loan due tomorrow', text: 'Bring the kit back.' });
    }, 200);
    const message = await waitForMessage({
      to: 'di@quillmere.test',
      match: (m) => m.subject.startsWith('Loan due'),
    });
    clearTimeout(later);
    expect(message.text).toContain('Bring the kit back.');
    await expect(waitForMessage({ to: 'nobody@quillmere.test', timeoutMs: 300 })).rejects.toThrow(
      /arrived in time/,
    );
  });

  test('messages survive a restart of the sink on the same ports, through the store file', async () => {
    const before = await listMessages();
    expect(before.length).toBeGreaterThan(0);
    const ports = { smtpPort: sink.smtpPort, httpPort: sink.httpPort };

    await sink.close();
    const onDisk = JSON.parse(await readFile(storeFile, 'utf8')) as { messages: { id: string }[] };
    expect(onDisk.messages.map((m) => m.id)).toEqual(before.map((m) => m.id));

    sink = await startSink(ports);
    expect(await listMessages()).toEqual(before);
    // The pooled transport lost its connection when the sink stopped; it must reconnect by itself.
    await sendMail({ to: 'ada@quillmere.test', subject: 'after restart', text: 'still here' });
    expect((await listMessages({ to: 'ada@quillmere.test' }))[0].subject).toBe('after restart');
  });

  test('DELETE /messages empties the mailbox, on disk too', async () => {
    await clearMessages();
    expect(await listMessages()).toEqual([]);
    await sink.store.flushed();
    const onDisk = JSON.parse(await readFile(storeFile, 'utf8')) as { messages: unknown[] };
    expect(onDisk.messages).toEqual([]);
  });
});

describe('message store', () => {
  test(`keeps only the newest ${MAILBOX_CAP} messages, and reloads them from disk`, async () => {
    const file = path.join(dir, 'cap.json');
    const store = new MessageStore(file);
    const total = MAILBOX_CAP + 7;
    for (let i = 0; i < total; i++) {
      await store.add({
        id: `m${i}`,
        receivedAt: new Date(Date.UTC(2030, 0, 1, 0, 0, i)).toISOString(),
        from: 'bench@ohmstead.invalid',
        to: ['ada@quillmere.test'],
        subject: `note ${i}`,
        text: '',
        html: null,
        messageId: null,
      });
    }
    expect(store.list().length).toBe(MAILBOX_CAP);
    expect(store.list()[0].id).toBe(`m${total - 1}`);
    expect(store.get('m6')).toBeUndefined();
    expect(store.get('m7')).toBeDefined();

    const reloaded = new MessageStore(file);
    await reloaded.load();
    expect(reloaded.list()).toEqual(store.list());
  });

  test('an unreadable store file is set aside and the sink starts empty', async () => {
    const file = path.join(dir, 'broken.json');
    await writeFile(file, '{"version":1,"messages":[{"id":', 'utf8');
    const lines: string[] = [];
    const store = new MessageStore(file, (l) => lines.push(l));
    await store.load();
    expect(store.list()).toEqual([]);
    expect(lines.join('\n')).toMatch(/unreadable/);
    await expect(readFile(file, 'utf8')).rejects.toMatchObject({ code: 'ENOENT' });
  });
});

describe('when mail cannot go out', () => {
  test('bad input is an InvalidError naming the field, before any connection', async () => {
    const err = await sendMail({ to: 'not-an-address', subject: 'x', text: 'y' }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(InvalidError);
    expect(Object.keys((err as InvalidError).fields ?? {})).toContain('to');
    const noSubject = await sendMail({ to: 'ada@quillmere.test', subject: '  ', text: 'y' }).catch(
      (e: unknown) => e,
    );
    expect(Object.keys((noSubject as InvalidError).fields ?? {})).toContain('subject');
  });

  test('nothing listening: sendMail rejects with UnavailableError within a few seconds', async () => {
    const config = { ...mailConfigFromEnv(), port: await closedPort() };
    const started = Date.now();
    await expect(
      sendMail({ to: 'ada@quillmere.test', subject: 'x', text: 'y' }, config),
    ).rejects.toBeInstanceOf(UnavailableError);
    expect(Date.now() - started).toBeLessThan(5_000);
  });

  test('a server that accepts but never greets: UnavailableError after the greeting timeout', async () => {
    const sockets = new Set<Socket>();
    const silent: Server = createServer((socket) => {
      sockets.add(socket);
      socket.on('error', () => {});
    });
    await new Promise<void>((resolve) => silent.listen(0, '127.0.0.1', resolve));
    const config = { ...mailConfigFromEnv(), port: (silent.address() as { port: number }).port };
    const started = Date.now();
    try {
      await expect(
        sendMail({ to: 'ada@quillmere.test', subject: 'x', text: 'y' }, config),
      ).rejects.toBeInstanceOf(UnavailableError);
      expect(Date.now() - started).toBeLessThan(8_000);
    } finally {
      for (const s of sockets) s.destroy();
      await new Promise<void>((resolve) => silent.close(() => resolve()));
    }
  });

  test('the sink stopped: sendMail and the mailbox reader both report UnavailableError', async () => {
    await sendMail({ to: 'ada@quillmere.test', subject: 'warm the pool', text: 'x' });
    await sink.close();
    const started = Date.now();
    await expect(sendMail({ to: 'ada@quillmere.test', subject: 'x', text: 'y' })).rejects.toBeInstanceOf(
      UnavailableError,
    );
    expect(Date.now() - started).toBeLessThan(5_000);
    await expect(listMessages()).rejects.toBeInstanceOf(UnavailableError);
    // Restart so afterAll's close has a live sink to stop.
    sink = await startSink({ smtpPort: sink.smtpPort, httpPort: sink.httpPort });
  });
});
