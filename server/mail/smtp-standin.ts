// The local SMTP stand-in: a real SMTP server on 127.0.0.1 that keeps every message it receives
// in MariaDB (table received_mail), so that the admin's Sent mail page shows what growers would
// read. It accepts any sender and recipient and delivers nowhere else. A message is answered
// "250 OK" only once it is stored; when storing fails the reply is a temporary 451, so the
// sender keeps the message and tries again.
import { simpleParser, type AddressObject } from 'mailparser';
import { SMTPServer, type SMTPServerDataStream, type SMTPServerSession } from 'smtp-server';
import { QueryTypes, type Sequelize } from 'sequelize';

export interface SmtpStandInOptions {
  sequelize: Sequelize;
  /** 0 picks a free port (tests). */
  port: number;
  host?: string;
  maxSizeBytes?: number;
  /** Called after each message is stored (tests and the benchmark count with it). */
  onStored?: (info: { messageId: string; repeat: boolean }) => void;
  /** Wait this long before answering each message (fault tests slow the server down). */
  delayMs?: number;
  log?: (line: string, err?: unknown) => void;
}

export interface SmtpStandIn {
  host: string;
  port: number;
  close(): Promise<void>;
}

function addressText(a: AddressObject | AddressObject[] | undefined): string | null {
  if (!a) return null;
  return (Array.isArray(a) ? a.map((x) => x.text).join(', ') : a.text).slice(0, 1000) || null;
}

async function readAll(stream: SMTPServerDataStream): Promise<Buffer> {
  const chunks: Buffer[] = [];
  for await (const chunk of stream) chunks.push(chunk as Buffer);
  return Buffer.concat(chunks);
}

export interface ReceivedRow {
  messageId: string;
  envelopeFrom: string | null;
  envelopeTo: string[];
  fromHeader: string | null;
  toHeader: string | null;
  subject: string | null;
  text: string | null;
  html: string | null;
  headers: Record<string, string>;
  sizeBytes: number;
}

/** Parses one received message into the row the Sent mail page reads. */
export async function parseReceivedMessage(raw: Buffer, session: Pick<SMTPServerSession, 'envelope'>): Promise<ReceivedRow> {
  // The sender writes both parts itself: no text↔HTML conversion is needed here.
  const parsed = await simpleParser(raw, { skipImageLinks: true, skipTextToHtml: true, skipHtmlToText: true, skipTextLinks: true });
  const headers: Record<string, string> = {};
  for (const { key, line } of parsed.headerLines) {
    const value = line.slice(line.indexOf(':') + 1).trim();
    headers[key] = headers[key] ? `${headers[key]}, ${value}` : value;
  }
  return {
    messageId: (parsed.messageId ?? `<stand-in-${Date.now()}-${Math.random().toString(36).slice(2)}@rowpath.local>`).slice(0, 191),
    envelopeFrom: session.envelope.mailFrom ? session.envelope.mailFrom.address.slice(0, 191) : null,
    envelopeTo: session.envelope.rcptTo.map((r) => r.address),
    fromHeader: addressText(parsed.from),
    toHeader: addressText(parsed.to),
    subject: (parsed.subject ?? '').slice(0, 255) || null,
    text: parsed.text ?? null,
    html: typeof parsed.html === 'string' ? parsed.html : null,
    headers,
    sizeBytes: raw.length,
  };
}

/**
 * Stores messages once per Message-ID (a repeat only counts up repeat_count), many per statement:
 * messages arriving together on several connections share one insert and one commit.
 * Returns, per message, whether it was a repeat.
 */
export async function storeReceivedRows(sequelize: Sequelize, rows: ReceivedRow[]): Promise<boolean[]> {
  const ids = [...new Set(rows.map((r) => r.messageId))];
  const known = new Set(
    (await sequelize.query<{ messageId: string }>('SELECT message_id AS messageId FROM received_mail WHERE message_id IN (?)', { type: QueryTypes.SELECT, replacements: [ids] })).map((r) => r.messageId),
  );
  const now = new Date();
  const values: unknown[] = [];
  for (const r of rows) values.push(r.messageId, r.envelopeFrom, JSON.stringify(r.envelopeTo), r.fromHeader, r.toHeader, r.subject, r.text, r.html, JSON.stringify(r.headers), r.sizeBytes, now);
  await sequelize.query(
    `INSERT INTO received_mail (message_id, envelope_from, envelope_to, from_header, to_header, subject, text, html, headers, size_bytes, repeat_count, received_at)
     VALUES ${rows.map(() => '(?, ?, ?, ?, ?, ?, ?, ?, ?, ?, 0, ?)').join(', ')}
     ON DUPLICATE KEY UPDATE repeat_count = repeat_count + 1`,
    { type: QueryTypes.INSERT, replacements: values },
  );
  const seen = new Set<string>();
  return rows.map((r) => {
    const repeat = known.has(r.messageId) || seen.has(r.messageId);
    seen.add(r.messageId);
    return repeat;
  });
}

/** Parses and stores one message (tests and tools; the server itself groups its writes). */
export async function storeReceivedMessage(sequelize: Sequelize, raw: Buffer, session: Pick<SMTPServerSession, 'envelope'>): Promise<{ messageId: string; repeat: boolean }> {
  const row = await parseReceivedMessage(raw, session);
  const [repeat] = await storeReceivedRows(sequelize, [row]);
  return { messageId: row.messageId, repeat };
}

/** Collects rows written at about the same moment into one statement; each caller learns its own outcome. */
function groupedWriter(sequelize: Sequelize, maxRows = 50) {
  const queue: { row: ReceivedRow; resolve: (repeat: boolean) => void; reject: (err: unknown) => void }[] = [];
  let scheduled = false;
  const flush = async () => {
    scheduled = false;
    const group = queue.splice(0, maxRows);
    if (queue.length) schedule();
    try {
      const repeats = await storeReceivedRows(sequelize, group.map((g) => g.row));
      group.forEach((g, i) => g.resolve(repeats[i]));
    } catch (err) {
      for (const g of group) g.reject(err);
    }
  };
  const schedule = () => {
    if (scheduled) return;
    scheduled = true;
    setImmediate(() => void flush());
  };
  return (row: ReceivedRow) =>
    new Promise<boolean>((resolve, reject) => {
      queue.push({ row, resolve, reject });
      schedule();
    });
}

/** Starts the stand-in on 127.0.0.1. Fails (EADDRINUSE) when the port is taken. */
export async function startSmtpStandIn(options: SmtpStandInOptions): Promise<SmtpStandIn> {
  const host = options.host ?? '127.0.0.1';
  const log = options.log ?? ((line: string, err?: unknown) => console.error(line, err ?? ''));
  const store = groupedWriter(options.sequelize);
  const server = new SMTPServer({
    name: 'rowpath-smtp-stand-in',
    banner: 'Rowpath local SMTP stand-in: messages are kept for the Sent mail page and go nowhere else',
    // Plain SMTP on loopback, no sign-in: nothing here leaves the machine.
    disabledCommands: ['STARTTLS', 'AUTH'],
    authOptional: true,
    logger: false,
    // On close, connections still open (an idle pooled client) are cut after this long.
    closeTimeout: 2_000,
    size: options.maxSizeBytes ?? 10 * 1024 * 1024,
    onData(stream, session, callback) {
      readAll(stream)
        .then(async (raw) => {
          if (stream.sizeExceeded) {
            const err = Object.assign(new Error('Message is larger than the stand-in keeps'), { responseCode: 552 });
            return callback(err);
          }
          if (options.delayMs) await new Promise((r) => setTimeout(r, options.delayMs));
          const row = await parseReceivedMessage(raw, session);
          const stored = { messageId: row.messageId, repeat: await store(row) };
          options.onStored?.(stored);
          callback(null, stored.repeat ? 'OK: already kept (same Message-ID)' : 'OK: kept for the Sent mail page');
        })
        .catch((err) => {
          log('SMTP stand-in could not keep a message', err);
          callback(Object.assign(new Error('Cannot keep the message just now; try again later'), { responseCode: 451 }));
        });
    },
  });
  server.on('error', (err) => log('SMTP stand-in error', err));
  await new Promise<void>((resolve, reject) => {
    const onError = (err: Error) => reject(err);
    server.server.once('error', onError);
    server.listen(options.port, host, () => {
      server.server.off('error', onError);
      resolve();
    });
  });
  const address = server.server.address();
  const port = typeof address === 'object' && address ? address.port : options.port;
  return {
    host,
    port,
    close: () =>
      new Promise<void>((resolve) => {
        server.close(() => resolve());
      }),
  };
}
