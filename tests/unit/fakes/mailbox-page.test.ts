import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import nodemailer from 'nodemailer';
import { startSmtpSink, type SmtpSink } from '@/fakes/smtp/sink';
import { linkify } from '@/fakes/smtp/mailbox-page';

// The dev mailbox people read during the demo is served by the SMTP sink itself (not by the app's build):
// a real message sent over SMTP shows in its HTML list and on its own page, escaped.

let sink: SmtpSink;
beforeAll(async () => {
  sink = await startSmtpSink({ smtpPort: 0, httpPort: 0, host: '127.0.0.1', storeFile: null, log: () => {} });
  const transport = nodemailer.createTransport({ host: sink.host, port: sink.smtpPort, secure: false, ignoreTLS: true });
  await transport.sendMail({
    from: 'bench@quillmere.example',
    to: 'juniper@quillmere.example',
    subject: 'Your sign-in link <b>now</b>',
    text: 'Open http://127.0.0.1:3000/signin/link?token=abc to sign in.\n<script>alert(1)</script>',
  });
  transport.close();
});
afterAll(async () => sink?.close());

describe('dev mailbox page on the sink', () => {
  test('lists the message with its subject escaped, newest first', async () => {
    const res = await fetch(`${sink.url}/`);
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toMatch(/^text\/html/);
    expect(res.headers.get('content-security-policy')).toContain("default-src 'none'");
    const html = await res.text();
    expect(html).toContain('Your sign-in link &lt;b&gt;now&lt;/b&gt;');
    expect(html).toContain('to juniper@quillmere.example');
    expect(html).toContain('<meta name="viewport"');
  });

  test('one message: text escaped, its link clickable', async () => {
    const [message] = sink.store.list();
    const html = await (await fetch(`${sink.url}/view/${message.id}`)).text();
    expect(html).toContain('&lt;script&gt;alert(1)&lt;/script&gt;');
    expect(html).not.toContain('<script>');
    expect(html).toContain('<a href="http://127.0.0.1:3000/signin/link?token=abc" rel="noreferrer noopener">');
  });

  test('an unknown message is a 404 page; only GET is served', async () => {
    expect((await fetch(`${sink.url}/view/nope`)).status).toBe(404);
    expect((await fetch(`${sink.url}/`, { method: 'POST' })).status).toBe(405);
  });

  test('linkify escapes before linking, and links only http(s)', () => {
    expect(linkify('see javascript:alert(1) and https://a.example/x?y=1&z=2')).toBe(
      'see javascript:alert(1) and <a href="https://a.example/x?y=1&amp;z=2" rel="noreferrer noopener">https://a.example/x?y=1&amp;z=2</a>',
    );
  });
});
