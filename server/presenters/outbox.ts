import type { OutboxMessageDTO, OutboxMessageSummaryDTO } from '../../shared/api/outbox';
import type { OutboxMessage } from '../models/OutboxMessage';

/** A received message as the outbox list shows it (no bodies). */
export function presentOutboxSummary(message: OutboxMessage): OutboxMessageSummaryDTO {
  return {
    id: message.id,
    to: message.toAddresses.join(', '),
    from: message.fromAddress,
    subject: message.subject,
    receivedAt: message.receivedAt.toISOString(),
    sizeBytes: message.sizeBytes,
  };
}

/** A received message with its text and HTML bodies. */
export function presentOutboxMessage(message: OutboxMessage): OutboxMessageDTO {
  return { ...presentOutboxSummary(message), text: message.text, html: message.html };
}
