import { randomBytes } from 'node:crypto';
import type { AddressObject, EmailAddress, HeaderValue, ListHeaders, ParsedMail } from 'mailparser';

/*
 * The inbox: every accepted message, parsed, in arrival order, plus the counts a test reads to see what
 * the app sent (how many, how many refused, how many sent twice under one Message-ID).
 */

export const MAX_MESSAGES = 50_000;
/** Message-IDs remembered for duplicate counting; more than the inbox holds, fewer than memory allows. */
const MAX_SEEN_IDS = 200_000;

export type Address = { address: string; name: string };

export type StoredEmail = {
  id: string;
  messageId: string | null;
  subject: string;
  text: string;
  html: string | null;
  /** The Date header, or the time the message arrived when it has none; ISO 8601. */
  date: string;
  receivedAt: string;
  from: Address[];
  to: Address[];
  cc: Address[];
  /** The SMTP envelope: who the client said it sends for and to whom (Bcc recipients appear only here). */
  envelope: { from: string; to: string[] };
  headers: Record<string, string>;
  attachments: { filename: string | null; contentType: string; size: number }[];
  size: number;
  /** True when an earlier message carried the same Message-ID. */
  duplicate: boolean;
};

export type Stats = {
  received: number;
  refused: number;
  /** Recipients answered 550 at RCPT TO because a test listed them in `bounce`. */
  bounced: number;
  distinctMessageIds: number;
  duplicates: number;
};

function flattenAddresses(field: AddressObject | AddressObject[] | undefined): Address[] {
  if (!field) return [];
  const out: Address[] = [];
  const visit = (entry: EmailAddress) => {
    if (entry.group) entry.group.forEach(visit);
    else if (entry.address) out.push({ address: entry.address, name: entry.name ?? '' });
  };
  for (const object of Array.isArray(field) ? field : [field]) object.value.forEach(visit);
  return out;
}

function headerText(value: HeaderValue): string {
  if (typeof value === 'string') return value;
  if (value instanceof Date) return Number.isNaN(value.getTime()) ? '' : value.toISOString();
  if (Array.isArray(value)) return value.map((v) => headerText(v)).join(', ');
  if ('text' in value && typeof value.text === 'string') return value.text;
  if ('value' in value && typeof value.value === 'string' && 'params' in value) {
    const params = Object.entries(value.params).map(([k, v]) => `; ${k}=${v}`);
    return value.value + params.join('');
  }
  // The combined List-* headers: { unsubscribe: { url, mail }, id: { id, name } }.
  return Object.entries(value as ListHeaders)
    .map(([key, entry]) => `${key}: ${[entry.name, entry.id, entry.mail, entry.url].filter(Boolean).join(' ')}`)
    .join('; ');
}

function newId(): string {
  return randomBytes(6).toString('base64url');
}

export class Inbox {
  private messages = new Map<string, StoredEmail>();
  private seenIds = new Set<string>();
  private counts = { received: 0, refused: 0, bounced: 0, duplicates: 0 };

  constructor(private readonly capacity = MAX_MESSAGES) {}

  add(parsed: ParsedMail, envelope: StoredEmail['envelope'], size: number, receivedAt = new Date()): StoredEmail {
    const messageId = parsed.messageId?.trim() || null;
    const duplicate = messageId !== null && this.seenIds.has(messageId);
    if (messageId && !duplicate) {
      this.seenIds.add(messageId);
      if (this.seenIds.size > MAX_SEEN_IDS) this.seenIds.delete(this.seenIds.values().next().value!);
    }
    // No prototype: a header may be called anything, __proto__ included.
    const headers = Object.create(null) as Record<string, string>;
    for (const [name, value] of parsed.headers) headers[name.toLowerCase()] = headerText(value);
    // mailparser folds List-* (and the priority headers) into combined entries; keep the real ones too.
    for (const { key, line } of parsed.headerLines) {
      const name = key.toLowerCase();
      if (parsed.headers.has(name)) continue;
      const raw = line.slice(line.indexOf(':') + 1).replace(/\r?\n[ \t]+/g, ' ').trim();
      headers[name] = name in headers ? `${headers[name]}, ${raw}` : raw;
    }
    if (parsed.headerLines.some((h) => h.key.toLowerCase().startsWith('list-'))) delete headers.list;
    const date = parsed.date && !Number.isNaN(parsed.date.getTime()) ? parsed.date : receivedAt;
    const email: StoredEmail = {
      id: newId(),
      messageId,
      subject: parsed.subject ?? '',
      text: parsed.text ?? '',
      html: parsed.html || null,
      date: date.toISOString(),
      receivedAt: receivedAt.toISOString(),
      from: flattenAddresses(parsed.from),
      to: flattenAddresses(parsed.to),
      cc: flattenAddresses(parsed.cc),
      envelope,
      headers,
      attachments: parsed.attachments.map((a) => ({
        filename: a.filename ?? null,
        contentType: a.contentType,
        size: a.size,
      })),
      size,
      duplicate,
    };
    this.messages.set(email.id, email);
    if (this.messages.size > this.capacity) this.messages.delete(this.messages.keys().next().value!);
    this.counts.received += 1;
    if (duplicate) this.counts.duplicates += 1;
    return email;
  }

  countRefused(): void {
    this.counts.refused += 1;
  }

  countBounced(): void {
    this.counts.bounced += 1;
  }

  /** Oldest first; `to` matches the To and Cc headers and the envelope, without regard to case. */
  list(filter: { to?: string } = {}): StoredEmail[] {
    const all = [...this.messages.values()];
    const to = filter.to?.trim().toLowerCase();
    if (!to) return all;
    return all.filter(
      (m) =>
        m.to.some((a) => a.address.toLowerCase() === to) ||
        m.cc.some((a) => a.address.toLowerCase() === to) ||
        m.envelope.to.some((a) => a.toLowerCase() === to),
    );
  }

  get(id: string): StoredEmail | undefined {
    return this.messages.get(id);
  }

  get size(): number {
    return this.messages.size;
  }

  stats(): Stats {
    return { ...this.counts, distinctMessageIds: this.seenIds.size };
  }

  /** Empties the inbox and starts the counts again, so each test reads only what it caused. */
  clear(): void {
    this.messages.clear();
    this.seenIds.clear();
    this.counts = { received: 0, refused: 0, bounced: 0, duplicates: 0 };
  }
}
