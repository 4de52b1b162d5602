/**
 * Local SMTP catcher with a web inbox, for development and tests: smtp-server receives, mailparser
 * reads, and a small HTTP page lists what arrived. The app sends only through nodemailer to SMTP_URL,
 * so a hosted mail service is a configuration change.
 *   SMTP  127.0.0.1:1025     inbox  http://127.0.0.1:1080     JSON  /api/messages
 * Usage: node --import tsx fakes/mail.ts [--smtp-port 1025] [--web-port 1080] [--dir .data/mail]
 */
import { mkdirSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { createServer } from 'node:http';
import { join } from 'node:path';
import { parseArgs } from 'node:util';
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';

const { values } = parseArgs({
  options: {
    'smtp-port': { type: 'string', default: process.env.SMTP_PORT ?? '1025' },
    'web-port': { type: 'string', default: process.env.MAIL_WEB_PORT ?? '1080' },
    dir: { type: 'string', default: '.data/mail' },
  },
});
const dir = values.dir!;
mkdirSync(dir, { recursive: true });

interface Stored {
  id: string;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string | null;
}

function all(): Stored[] {
  return readdirSync(dir)
    .filter((f) => f.endsWith('.json'))
    .map((f) => JSON.parse(readFileSync(join(dir, f), 'utf8')) as Stored)
    .sort((a, b) => b.receivedAt.localeCompare(a.receivedAt));
}

let seq = 0;
const smtp = new SMTPServer({
  authOptional: true,
  disabledCommands: ['STARTTLS'],
  banner: 'Lossline mail catcher',
  onData(stream, session, callback) {
    simpleParser(stream)
      .then((mail) => {
        const id = `${Date.now().toString(36)}-${(seq++).toString(36)}`;
        const stored: Stored = {
          id,
          receivedAt: new Date().toISOString(),
          from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
          to: session.envelope.rcptTo.map((r) => r.address),
          subject: mail.subject ?? '',
          text: mail.text ?? '',
          html: typeof mail.html === 'string' ? mail.html : null,
        };
        writeFileSync(join(dir, `${id}.json`), JSON.stringify(stored));
        callback();
      })
      .catch((err: Error) => callback(err));
  },
});
smtp.on('error', (err) => console.error('[mail] smtp error', err.message));

const esc = (s: string) => s.replace(/[&<>"]/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;' })[c]!);
const page = (title: string, body: string) =>
  `<!doctype html><meta charset="utf-8"><title>${esc(title)}</title><style>body{font:14px system-ui;margin:2rem;background:#f7f3ea;color:#22201c}table{border-collapse:collapse}td,th{padding:4px 10px;border-bottom:1px solid #ddd3bf;text-align:left}pre{white-space:pre-wrap;background:#fff;padding:1rem;border:1px solid #ddd3bf}</style><h1>${esc(title)}</h1>${body}`;

const web = createServer((req, res) => {
  const url = new URL(req.url ?? '/', 'http://localhost');
  if (url.pathname === '/api/messages' && req.method === 'GET') {
    res.writeHead(200, { 'content-type': 'application/json' });
    return res.end(JSON.stringify(all()));
  }
  if (url.pathname === '/api/messages' && req.method === 'DELETE') {
    for (const f of readdirSync(dir)) rmSync(join(dir, f));
    res.writeHead(204);
    return res.end();
  }
  const m = url.pathname.match(/^\/messages\/([\w-]+)$/);
  if (m) {
    const mail = all().find((x) => x.id === m[1]);
    if (!mail) {
      res.writeHead(404);
      return res.end('not found');
    }
    res.writeHead(200, { 'content-type': 'text/html; charset=utf-8' });
    return res.end(
      page(mail.subject, `<p>To ${esc(mail.to.join(', '))} · ${esc(mail.receivedAt)}</p>${mail.html ?? `<pre>${esc(mail.text)}</pre>`}<p><a href="/">All messages</a></p>`),
    );
  }
  const rows = all()
    .map((x) => `<tr><td>${esc(x.receivedAt)}</td><td>${esc(x.to.join(', '))}</td><td><a href="/messages/${x.id}">${esc(x.subject)}</a></td></tr>`)
    .join('');
  res.writeHead(200, { 'content-type': 'text/html; charset=utf-8' });
  res.end(page('Caught mail', `<table><tr><th>Received</th><th>To</th><th>Subject</th></tr>${rows || '<tr><td colspan=3>Nothing yet.</td></tr>'}</table>`));
});

smtp.listen(Number(values['smtp-port']), '127.0.0.1', () => {
  web.listen(Number(values['web-port']), '127.0.0.1', () => {
    console.log(`[mail] SMTP on 127.0.0.1:${values['smtp-port']}, inbox http://127.0.0.1:${values['web-port']}`);
  });
});
const stop = () => {
  web.close();
  smtp.close(() => process.exit(0));
  setTimeout(() => process.exit(0), 1000).unref();
};
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
