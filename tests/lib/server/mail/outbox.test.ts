import { createServer, type AddressInfo } from 'node:net';
import { SMTPServer } from 'smtp-server';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { closeDb, db, ensureMigrated } from '../../../../src/lib/server/db';
import { enqueueMail, listOutbox, retryDelayMs, sendNextDueMail } from '../../../../src/lib/server/mail/outbox';
import { readEml } from '../../../../src/lib/server/mail/read-eml';
import { invitationMail, renderMail } from '../../../../src/lib/server/mail/templates';

type Received = { rcpt: string[]; raw: string };

/** An SMTP server on a free port that keeps what it receives, or refuses every recipient with 451. */
async function smtpServer(mode: 'accept' | 'refuse'): Promise<{ url: string; received: Received[]; close: () => Promise<void> }> {
  const received: Received[] = [];
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    onRcptTo(_address, _session, callback) {
      if (mode === 'refuse') {
        const error = Object.assign(new Error('Mailbox busy, try again later'), { responseCode: 451 });
        return callback(error);
      }
      callback();
    },
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (chunk: Buffer) => chunks.push(chunk));
      stream.on('end', () => {
        received.push({ rcpt: session.envelope.rcptTo.map((r) => r.address), raw: Buffer.concat(chunks).toString('utf8') });
        callback();
      });
    },
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', () => resolve()));
  const { port } = server.server.address() as AddressInfo;
  return { url: `smtp://127.0.0.1:${port}`, received, close: () => new Promise((resolve) => server.close(() => resolve())) };
}

/** A port nothing listens on: taken and released again. */
async function closedPort(): Promise<number> {
  const probe = createServer();
  await new Promise<void>((resolve) => probe.listen(0, '127.0.0.1', () => resolve()));
  const { port } = probe.address() as AddressInfo;
  await new Promise((resolve) => probe.close(resolve));
  return port;
}

const message = () =>
  renderMail({
    to: 'crew@test.example',
    subject: 'Flood check',
    heading: 'Check the <creek> crossing',
    paragraphs: ['Water went over "Dry Gully" & the flats.'],
    action: { label: 'Open', url: 'https://gullyline.example.org/app?x=1&y=2' },
  });

beforeAll(ensureMigrated);
beforeEach(async () => {
  await db()('outbox').delete();
});
afterAll(closeDb);

describe('retry schedule', () => {
  it('waits 1, 5, 25 and 125 minutes, then at most six hours', () => {
    expect([1, 2, 3, 4, 5, 6, 10].map((n) => retryDelayMs(n) / 60_000)).toEqual([1, 5, 25, 125, 360, 360, 360]);
  });
});

describe('templates', () => {
  it('writes both parts, escapes what people typed in the HTML and keeps the link absolute', () => {
    const mail = message();
    expect(mail.text).toContain('Check the <creek> crossing');
    expect(mail.text).toContain('https://gullyline.example.org/app?x=1&y=2');
    expect(mail.html).toContain('Check the &lt;creek&gt; crossing');
    expect(mail.html).toContain('&quot;Dry Gully&quot; &amp; the flats');
    expect(mail.html).not.toContain('<creek>');
    expect(mail.html).toContain('href="https://gullyline.example.org/app?x=1&amp;y=2"');
    expect(mail.html).toContain('name="viewport"');
  });

  it('says who invites, where, as what and until when', () => {
    const mail = invitationMail({
      to: 'new@test.example', propertyName: 'Saltbush <Rise>', inviterName: 'Ann', role: 'manager',
      acceptUrl: 'https://g.example/invitations/accept?token=abc', expiresAt: new Date('2027-01-08T00:00:00Z'),
    });
    expect(mail.subject).toBe('Ann invited you to Saltbush <Rise> on Gullyline');
    expect(mail.text).toContain('as a manager');
    expect(mail.text).toContain('8 January 2027');
    expect(mail.html).toContain('Saltbush &lt;Rise&gt;');
  });
});

describe('outbox', () => {
  it('sends a queued message with its text and HTML parts to the right recipient', async () => {
    const smtp = await smtpServer('accept');
    try {
      const id = await enqueueMail(message());
      expect(await sendNextDueMail({ smtpUrl: smtp.url })).toBe(id);
      expect(smtp.received).toHaveLength(1);
      expect(smtp.received[0]!.rcpt).toEqual(['crew@test.example']);
      const parsed = readEml(smtp.received[0]!.raw);
      expect(parsed.to).toBe('crew@test.example');
      expect(parsed.subject).toBe('Flood check');
      expect(parsed.text).toContain('Water went over "Dry Gully" & the flats.');
      expect(parsed.html).toContain('Check the &lt;creek&gt; crossing');
      expect(smtp.received[0]!.raw).toMatch(/Content-Type: multipart\/alternative/i);
      const [entry] = await listOutbox();
      expect(entry).toMatchObject({ id, status: 'sent', attempts: 1, lastError: null });
      expect(entry!.sentAt).not.toBeNull();
      expect(await sendNextDueMail({ smtpUrl: smtp.url }), 'nothing left to send').toBeUndefined();
    } finally {
      await smtp.close();
    }
  });

  it('carries attachments', async () => {
    const smtp = await smtpServer('accept');
    try {
      await enqueueMail({ ...message(), attachments: [{ filename: 'posts.geojson', contentType: 'application/geo+json', contentBase64: Buffer.from('{"type":"FeatureCollection","features":[]}').toString('base64') }] });
      await sendNextDueMail({ smtpUrl: smtp.url });
      expect(readEml(smtp.received[0]!.raw).attachments).toEqual(['posts.geojson']);
    } finally {
      await smtp.close();
    }
  });

  it('retries a refused message later and later, then marks it failed with the reason and keeps it', async () => {
    const smtp = await smtpServer('refuse');
    try {
      const id = await enqueueMail(message());
      let now = new Date();
      for (let attempt = 1; attempt <= 3; attempt++) {
        expect(await sendNextDueMail({ smtpUrl: smtp.url, now, maxAttempts: 3 })).toBe(id);
        const row = await db()('outbox').where({ id }).first();
        expect(row.attempts).toBe(attempt);
        expect(row.last_error).toMatch(/451|busy/i);
        if (attempt < 3) {
          expect(row.status).toBe('queued');
          expect(Date.parse(row.next_attempt_at) - now.getTime()).toBe(retryDelayMs(attempt));
          expect(await sendNextDueMail({ smtpUrl: smtp.url, now, maxAttempts: 3 }), 'not due again yet').toBeUndefined();
          now = new Date(Date.parse(row.next_attempt_at));
        } else {
          expect(row.status).toBe('failed');
          expect(row.last_error).toMatch(/^Gave up after 3 attempts/);
        }
      }
      expect(smtp.received).toHaveLength(0);
      expect(await sendNextDueMail({ smtpUrl: smtp.url, now: new Date(Date.now() + 86_400_000), maxAttempts: 3 })).toBeUndefined();
      expect(await db()('outbox').where({ id }).first('text')).toEqual({ text: message().text });
    } finally {
      await smtp.close();
    }
  });

  it('counts an unreachable server as a failed attempt and tries again later', async () => {
    const id = await enqueueMail(message());
    const now = new Date();
    await sendNextDueMail({ smtpUrl: `smtp://127.0.0.1:${await closedPort()}`, now, maxAttempts: 5 });
    const row = await db()('outbox').where({ id }).first();
    expect(row).toMatchObject({ status: 'queued', attempts: 1 });
    expect(row.last_error).toMatch(/ECONNREFUSED|connect/i);
    expect(Date.parse(row.next_attempt_at)).toBe(now.getTime() + 60_000);
  });

  it('keeps a queued message out of the outbox when its transaction rolls back', async () => {
    await expect(
      db().transaction(async (trx) => {
        await enqueueMail(message(), trx);
        throw new Error('the change failed');
      }),
    ).rejects.toThrow('the change failed');
    expect(await listOutbox()).toEqual([]);
  });
});
