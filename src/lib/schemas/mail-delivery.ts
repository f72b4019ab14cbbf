/** Where a message stands in the outbox, as the person who caused it sees it. */
export type MailDelivery = {
  status: 'queued' | 'sending' | 'sent' | 'failed';
  attempts: number;
  /** The mail server's last refusal, when a try failed. */
  lastError: string | null;
  /** When the next try is due (queued messages that failed before). */
  nextAttemptAt: string | null;
};
