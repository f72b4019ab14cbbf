import type { Knex } from 'knex';
import { getConfig } from '../config';
import { db } from '../db';
import { startMailCatcher } from '../mail-catcher';
import { sendMail, type MailAttachment, type MailMessage } from './send-mail';

export type OutboxStatus = 'queued' | 'sending' | 'sent' | 'failed';

export type OutboxEntry = {
  id: number;
  to: string;
  subject: string;
  text: string;
  status: OutboxStatus;
  attempts: number;
  nextAttemptAt: string;
  lastError: string | null;
  createdAt: string;
  sentAt: string | null;
};

type OutboxRow = {
  id: number;
  to: string;
  subject: string;
  text: string;
  html: string;
  attachments: string | null;
  status: OutboxStatus;
  attempts: number;
  next_attempt_at: string;
  last_error: string | null;
  created_at: string;
  sent_at: string | null;
};

function rowToEntry(row: OutboxRow): OutboxEntry {
  return {
    id: row.id,
    to: row.to,
    subject: row.subject,
    text: row.text,
    status: row.status,
    attempts: row.attempts,
    nextAttemptAt: row.next_attempt_at,
    lastError: row.last_error,
    createdAt: row.created_at,
    sentAt: row.sent_at,
  };
}

const MINUTE_MS = 60_000;
const MAX_DELAY_MS = 6 * 60 * MINUTE_MS;

/** Wait after the `attempt`-th failed send: 1 min, 5, 25, 125, then at most 6 h. */
export function retryDelayMs(attempt: number): number {
  return Math.min(MINUTE_MS * 5 ** Math.max(0, attempt - 1), MAX_DELAY_MS);
}

/**
 * Queues a message; call it inside the transaction that made the change it reports, so the
 * message exists exactly when the change does. The worker sends it moments later.
 */
export async function enqueueMail(message: MailMessage, trx: Knex = db()): Promise<number> {
  const now = new Date().toISOString();
  const [row] = await trx('outbox')
    .insert({
      to: message.to,
      subject: message.subject,
      text: message.text,
      html: message.html,
      attachments: message.attachments?.length ? JSON.stringify(message.attachments) : null,
      status: 'queued',
      attempts: 0,
      next_attempt_at: now,
      created_at: now,
    })
    .returning('id');
  // The worker's query waits for this transaction's connection, so it sees the committed row.
  setImmediate(wakeMailWorker);
  return (row as { id: number }).id;
}

export async function listOutbox(limit = 100, trx: Knex = db()): Promise<OutboxEntry[]> {
  const rows = await trx<OutboxRow>('outbox').orderBy('id', 'desc').limit(limit);
  return rows.map(rowToEntry);
}

export type SendOptions = { smtpUrl: string | undefined; now?: Date; maxAttempts?: number };

/**
 * Sends the message that has waited longest, if one is due. A failure counts an attempt and
 * moves the next one out by {@link retryDelayMs}; after the last attempt the row is `failed`
 * with the reason, and stays in the outbox.
 * @returns the id of the message tried, or undefined when none was due
 */
export async function sendNextDueMail(options: SendOptions): Promise<number | undefined> {
  const now = options.now ?? new Date();
  const maxAttempts = options.maxAttempts ?? getConfig().mailMaxAttempts;
  const row = await db()<OutboxRow>('outbox')
    .where({ status: 'queued' })
    .andWhere('next_attempt_at', '<=', now.toISOString())
    .orderBy([{ column: 'next_attempt_at' }, { column: 'id' }])
    .first();
  if (!row) return undefined;
  const claimed = await db()('outbox').where({ id: row.id, status: 'queued' }).update({ status: 'sending' });
  if (claimed === 0) return undefined;
  const attempts = row.attempts + 1;
  try {
    if (!options.smtpUrl) throw new Error('No SMTP server is configured (SMTP_URL is empty).');
    await sendMail(
      {
        to: row.to,
        subject: row.subject,
        text: row.text,
        html: row.html,
        attachments: row.attachments ? (JSON.parse(row.attachments) as MailAttachment[]) : undefined,
      },
      options.smtpUrl,
    );
    await db()('outbox').where({ id: row.id }).update({ status: 'sent', attempts, sent_at: new Date().toISOString(), last_error: null });
  } catch (error) {
    const reason = (error instanceof Error ? error.message : String(error)).slice(0, 1000);
    const failed = attempts >= maxAttempts;
    await db()('outbox')
      .where({ id: row.id })
      .update({
        status: failed ? 'failed' : 'queued',
        attempts,
        last_error: failed ? `Gave up after ${attempts} attempts: ${reason}` : reason,
        next_attempt_at: failed ? row.next_attempt_at : new Date(now.getTime() + retryDelayMs(attempts)).toISOString(),
      });
  }
  return row.id;
}

let worker: { smtpUrl: string | undefined; running: boolean; again: boolean } | undefined;

/**
 * Starts the outbox worker in the server process: messages go one at a time, checked every few
 * seconds and whenever one is queued. Outside production with no SMTP_URL, a local catcher is
 * started in-process so development mail lands in DATA_DIR/mail. A message left `sending` by a
 * restart is queued again (it may arrive twice, never not at all).
 */
export async function startMailWorker(): Promise<void> {
  if (worker) return;
  const config = getConfig();
  worker = { smtpUrl: config.smtpUrl, running: false, again: false };
  if (!config.smtpUrl && config.env !== 'production') {
    worker.smtpUrl = (await startMailCatcher({ dataDir: config.dataDir })).url;
  }
  await db()('outbox').where({ status: 'sending' }).update({ status: 'queued' });
  setInterval(wakeMailWorker, 5_000).unref();
  wakeMailWorker();
}

/** Sends whatever is due now; a wake while sending runs the loop once more afterwards. */
export function wakeMailWorker(): void {
  if (!worker) return;
  if (worker.running) {
    worker.again = true;
    return;
  }
  const current = worker;
  current.running = true;
  void (async () => {
    try {
      do {
        current.again = false;
        while ((await sendNextDueMail({ smtpUrl: current.smtpUrl })) !== undefined) {
          // one message at a time until none is due
        }
      } while (current.again);
    } catch (error) {
      console.error('[gullyline] outbox worker:', error);
    } finally {
      current.running = false;
    }
  })();
}
