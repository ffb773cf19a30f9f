/** The captured-mail pages of the local fakes: /mailbox (list), /mailbox/:id (one message). */
import express, { type Router } from 'express';
import type { Mailbox } from './smtp-capture.js';
import { escapeHtml, page } from './html.js';

export function mailboxRouter(mailbox: Mailbox): Router {
  const router = express.Router();

  router.get('/api/messages', (_req, res) => {
    res.json(mailbox.list());
  });

  router.get('/api/stats', (_req, res) => {
    res.json(mailbox.stats());
  });

  router.delete('/api/messages', (_req, res) => {
    mailbox.clear();
    res.status(204).end();
  });

  router.get('/', (_req, res) => {
    const messages = mailbox.list();
    const rows = messages
      .map(
        (m) =>
          `<tr><td>${escapeHtml(new Date(m.receivedAt).toLocaleString('en-GB'))}</td><td>${escapeHtml(m.to.join(', '))}</td>` +
          `<td><a href="/mailbox/${m.id}">${escapeHtml(m.subject || '(no subject)')}</a></td><td>${m.attachments.length || ''}</td>` +
          `<td>${m.repeats ? `${m.repeats + 1}× (same Message-ID)` : ''}</td></tr>`,
      )
      .join('');
    res.type('html').send(
      page(
        'Captured e-mail',
        `<p>Every e-mail Cairn sends in development lands here; nothing leaves this machine. A message that arrives again with the same Message-ID is counted as a repeat, not listed twice. Addresses at refused.example are refused, as a real server refuses an unknown mailbox.</p>
         ${messages.length ? `<table><thead><tr><th>Received</th><th>To</th><th>Subject</th><th>Attachments</th><th>Arrived</th></tr></thead><tbody>${rows}</tbody></table>` : '<p class="empty">No e-mail has been sent yet.</p>'}`,
      ),
    );
  });

  router.get('/:id', (req, res) => {
    const message = mailbox.get(req.params.id);
    if (!message) {
      res
        .status(404)
        .type('html')
        .send(
          page('Not found', '<p>No such message. <a href="/mailbox">Back to the mailbox</a></p>'),
        );
      return;
    }
    const attachments = message.attachments
      .map(
        (a) =>
          `<li><a href="/mailbox/${message.id}/attachments/${a.index}">${escapeHtml(a.filename)}</a> (${escapeHtml(a.contentType)}, ${a.size} bytes)</li>`,
      )
      .join('');
    res.type('html').send(
      page(
        message.subject || '(no subject)',
        `<p><a href="/mailbox">← All messages</a> · <a href="/mailbox/${message.id}/raw">raw</a></p>
         <dl><dt>From</dt><dd>${escapeHtml(message.from)}</dd><dt>To</dt><dd>${escapeHtml(message.to.join(', '))}</dd>
         <dt>Message-ID</dt><dd>${escapeHtml(message.messageId ?? '(none)')}</dd>
         ${message.repeats ? `<dt>Repeats</dt><dd>arrived ${message.repeats} more time${message.repeats === 1 ? '' : 's'} with the same Message-ID</dd>` : ''}</dl>
         ${attachments ? `<h2>Attachments</h2><ul>${attachments}</ul>` : ''}
         ${message.html ? `<iframe title="Message" sandbox="" srcdoc="${escapeHtml(message.html)}"></iframe><h2>Plain-text part</h2><pre>${escapeHtml(message.text)}</pre>` : `<pre>${escapeHtml(message.text)}</pre>`}`,
      ),
    );
  });

  router.get('/:id/raw', (req, res) => {
    const raw = mailbox.raw(req.params.id);
    if (!raw) return void res.status(404).end();
    res.type('message/rfc822').send(raw);
  });

  router.get('/:id/attachments/:index', async (req, res) => {
    const attachment = await mailbox.attachment(req.params.id, Number(req.params.index));
    if (!attachment) return void res.status(404).end();
    res.setHeader(
      'Content-Disposition',
      `attachment; filename="${(attachment.filename ?? 'attachment').replace(/"/g, '')}"`,
    );
    res.type(attachment.contentType).send(attachment.content);
  });

  return router;
}
