import { connect } from 'node:net';
import nodemailer, { type SendMailOptions, type Transporter } from 'nodemailer';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { startMailServer, type CapturedMail, type RunningMailServer } from '../../../api/dev/mail-server';
import { createMailer } from '../../../api/lib/mailer';

function transportTo(port: number) {
  return nodemailer.createTransport({ host: '127.0.0.1', port, secure: false, ignoreTLS: true });
}

/** What a TCP client sees when it knocks on the port. */
function tryConnect(port: number): Promise<'open' | string> {
  return new Promise((resolve) => {
    const socket = connect(port, '127.0.0.1');
    socket.once('connect', () => {
      socket.destroy();
      resolve('open');
    });
    socket.once('error', (error: NodeJS.ErrnoException) => resolve(error.code ?? error.message));
  });
}

const alertMail = (overrides: Partial<SendMailOptions> = {}): SendMailOptions => ({
  from: '"Brinewatch alerts" <alerts@brinewatch.test>',
  to: 'Helen Ashdown <helen@ashdown-home.test>',
  bcc: 'tomas@driftglass.test',
  subject: 'Salinity is high in the lounge reef',
  text: 'Salinity read 1.028 SG at 14:10. See http://localhost:3000/tanks/t-lounge/alerts.',
  html: '<p>Salinity read <strong>1.028 SG</strong> at 14:10.</p>',
  headers: { 'X-Brinewatch-Alert': 'al-2041' },
  ...overrides,
});

/** Every byte value, so a transfer encoding that mangles binary shows. */
const binary = Buffer.from(Array.from({ length: 1024 }, (_, index) => (index * 7) % 256));
const invoiceAttachments = [
  { filename: 'INV-000042.pdf', content: binary, contentType: 'application/pdf' },
  {
    filename: 'Poznámky – návštěva.txt',
    content: Buffer.from('Skimmer cup cleaned.\n'),
    contentType: 'text/plain',
  },
];

describe('mail stand-in', () => {
  let mail: RunningMailServer;
  let transport: Transporter;

  beforeAll(async () => {
    mail = await startMailServer({ smtpPort: 0, httpPort: 0 });
    transport = transportTo(mail.smtpPort);
  });

  beforeEach(() => {
    mail.clear();
  });

  afterAll(async () => {
    transport.close();
    await mail.close();
  });

  describe('SMTP', () => {
    it('captures a sent message with its envelope, bodies and headers', async () => {
      await transport.sendMail(alertMail());

      const captured = await mail.waitFor((m) => m.subject.startsWith('Salinity is high'));

      expect(captured).toMatchObject<Partial<CapturedMail>>({
        from: '"Brinewatch alerts" <alerts@brinewatch.test>',
        to: ['helen@ashdown-home.test', 'tomas@driftglass.test'],
        subject: 'Salinity is high in the lounge reef',
        html: '<p>Salinity read <strong>1.028 SG</strong> at 14:10.</p>',
      });
      expect(captured.text.trim()).toBe(alertMail().text);
      expect(captured.headers['x-brinewatch-alert']).toBe('al-2041');
      expect(captured.headers['bcc']).toBeUndefined();
      expect(Date.parse(captured.receivedAt)).not.toBeNaN();
      expect(mail.messages()).toEqual([captured]);
    });

    it('keeps html null for a plain-text message', async () => {
      await transport.sendMail(alertMail({ html: undefined, subject: 'Plain only' }));

      const captured = await mail.waitFor((m) => m.subject === 'Plain only');

      expect(captured.html).toBeNull();
    });

    it('keeps the attachments the app sends, byte for byte, with their names and types', async () => {
      const mailer = createMailer({
        host: '127.0.0.1',
        port: mail.smtpPort,
        from: 'billing@brinewatch.test',
      });

      await mailer.send({
        to: 'helen@ashdown-home.test',
        subject: 'Invoice INV-000042',
        text: 'Attached.',
        html: '<p>Attached.</p>',
        attachments: invoiceAttachments,
      });
      const captured = await mail.waitFor((m) => m.subject === 'Invoice INV-000042');

      expect(captured.attachments).toEqual(
        invoiceAttachments.map((a) => ({ ...a, size: a.content.length, content: expect.any(Buffer) })),
      );
      expect(
        captured.attachments.map((a) =>
          a.content.equals(invoiceAttachments.find((b) => b.filename === a.filename)!.content),
        ),
      ).toEqual([true, true]);
      expect(captured.text.trim()).toBe('Attached.');
    });

    it('has no attachments for a message without any', async () => {
      await transport.sendMail(alertMail({ subject: 'No files' }));

      const captured = await mail.waitFor((m) => m.subject === 'No files');

      expect(captured.attachments).toEqual([]);
    });

    it('resolves waitFor with a message that arrived before it was called', async () => {
      await transport.sendMail(alertMail({ subject: 'Already here' }));

      await expect(mail.waitFor((m) => m.subject === 'Already here', 50)).resolves.toMatchObject({
        subject: 'Already here',
      });
    });

    it('rejects waitFor after the timeout, listing what did arrive', async () => {
      await transport.sendMail(alertMail({ subject: 'Something else' }));

      await expect(mail.waitFor((m) => m.subject === 'Never sent', 100)).rejects.toThrow(
        /No matching mail within 100 ms. Received: "Something else"/,
      );
    });

    it('refuses a message over 10 MB', async () => {
      const huge = 'x'.repeat(11 * 1024 * 1024);

      await expect(transport.sendMail(alertMail({ subject: 'Too big', text: huge }))).rejects.toMatchObject({
        responseCode: 552,
      });
      expect(mail.messages()).toEqual([]);
    });

    it('refuses connections while paused and accepts them again on the same port after resume', async () => {
      await mail.pause();

      expect(await tryConnect(mail.smtpPort)).toBe('ECONNREFUSED');
      await expect(transportTo(mail.smtpPort).sendMail(alertMail({ subject: 'While down' }))).rejects.toThrow(
        /ECONNREFUSED/,
      );

      await mail.resume();

      expect(await tryConnect(mail.smtpPort)).toBe('open');
      await transportTo(mail.smtpPort).sendMail(alertMail({ subject: 'Back up' }));
      await expect(mail.waitFor((m) => m.subject === 'Back up')).resolves.toBeTruthy();
      expect(mail.messages().map((m) => m.subject)).toEqual(['Back up']);
    });
  });

  describe('mailbox page', () => {
    const page = (path: string) => fetch(`http://127.0.0.1:${mail.httpPort}${path}`);
    const hostile = {
      subject: '<img src=x onerror=alert(1)> Nitrate & "you"',
      html: '<p>Hello</p><script>alert("html body")</script><a href="http://localhost:3000/x?a=1&b=2">Open</a>',
    };

    it('lists messages newest first, with the subject escaped', async () => {
      await transport.sendMail(alertMail({ subject: 'First of two' }));
      await transport.sendMail(alertMail(hostile));
      await mail.waitFor((m) => m.subject === hostile.subject);

      const response = await page('/');
      const html = await response.text();

      expect(response.headers.get('content-type')).toBe('text/html; charset=utf-8');
      expect(html).toContain('<title>Brinewatch demo mailbox</title>');
      expect(html).toContain('<html lang="en">');
      expect(html).toContain('local stand-in');
      expect(html).not.toContain('<img src=x');
      expect(html).toContain('&lt;img src=x onerror=alert(1)&gt; Nitrate &amp; &quot;you&quot;');
      expect(html.indexOf('Nitrate &amp;')).toBeLessThan(html.indexOf('First of two'));
    });

    it('shows one message: clickable links in the text and the HTML body in a sandboxed frame', async () => {
      await transport.sendMail(alertMail(hostile));
      const captured = await mail.waitFor((m) => m.subject === hostile.subject);

      const response = await page(`/messages/${captured.id}`);
      const html = await response.text();

      expect(response.status).toBe(200);
      expect(response.headers.get('content-security-policy')).toContain("script-src 'none'");
      expect(html).toContain(
        '<a href="http://localhost:3000/tanks/t-lounge/alerts">http://localhost:3000/tanks/t-lounge/alerts</a>.',
      );
      const frame = /<iframe[^>]*>/.exec(html)?.[0] ?? '';
      expect(frame).toContain('sandbox="allow-popups allow-popups-to-escape-sandbox"');
      expect(frame).toContain('&lt;script&gt;alert(&quot;html body&quot;)&lt;/script&gt;');
      expect(frame).toContain('href=&quot;http://localhost:3000/x?a=1&amp;b=2&quot;');
      expect(html).not.toContain('<script>');
      expect(html).not.toContain('<img src=x');
    });

    it('lists attachments with download links and serves each one with its type and name', async () => {
      await transport.sendMail(alertMail({ subject: 'With files', attachments: invoiceAttachments }));
      const captured = await mail.waitFor((m) => m.subject === 'With files');

      const list = await (await page('/')).text();
      const html = await (await page(`/messages/${captured.id}`)).text();
      const pdf = await page(`/messages/${captured.id}/attachments/0`);
      const note = await page(`/messages/${captured.id}/attachments/1`);

      expect(list).toContain('2 attachments');
      expect(html).toContain(`<a href="/messages/${captured.id}/attachments/0" download>INV-000042.pdf</a>`);
      expect(html).toContain('application/pdf, 1.0 KB');
      expect(html).toContain(
        `<a href="/messages/${captured.id}/attachments/1" download>Poznámky – návštěva.txt</a>`,
      );
      expect(pdf.status).toBe(200);
      expect(pdf.headers.get('content-type')).toBe('application/pdf');
      expect(pdf.headers.get('content-disposition')).toBe(
        'attachment; filename="INV-000042.pdf"; filename*=UTF-8\'\'INV-000042.pdf',
      );
      expect(pdf.headers.get('content-security-policy')).toContain('sandbox');
      expect(Buffer.from(await pdf.arrayBuffer()).equals(binary)).toBe(true);
      expect(note.headers.get('content-disposition')).toBe(
        `attachment; filename="Pozn_mky _ n_v_t_va.txt"; filename*=UTF-8''${encodeURIComponent('Poznámky – návštěva.txt')}`,
      );
      expect(await note.text()).toBe('Skimmer cup cleaned.\n');
    });

    it('escapes an attachment name on the page and keeps it out of the headers as sent', async () => {
      const hostileName = '"><img src=x onerror=alert(1)>.html';
      await transport.sendMail(
        alertMail({
          subject: 'Hostile file',
          attachments: [
            { filename: hostileName, content: '<script>alert(1)</script>', contentType: 'text/html' },
          ],
        }),
      );
      const captured = await mail.waitFor((m) => m.subject === 'Hostile file');

      const html = await (await page(`/messages/${captured.id}`)).text();
      const file = await page(`/messages/${captured.id}/attachments/0`);

      expect(html).not.toContain('<img src=x');
      expect(html).toContain('&quot;&gt;&lt;img src=x onerror=alert(1)&gt;.html');
      expect(file.headers.get('content-disposition')).toMatch(
        /^attachment; filename="_><img src=x onerror=alert\(1\)>\.html"; /,
      );
      expect(file.headers.get('content-security-policy')).toBe("sandbox; default-src 'none'");
    });

    it('answers 404 for an attachment it does not have', async () => {
      await transport.sendMail(
        alertMail({ subject: 'One file', attachments: invoiceAttachments.slice(0, 1) }),
      );
      const captured = await mail.waitFor((m) => m.subject === 'One file');

      expect((await page(`/messages/${captured.id}/attachments/0`)).status).toBe(200);
      expect((await page(`/messages/${captured.id}/attachments/1`)).status).toBe(404);
      expect((await page('/messages/no-such-message/attachments/0')).status).toBe(404);
    });

    it('describes attachments in JSON with a link instead of their bytes', async () => {
      await transport.sendMail(
        alertMail({ subject: 'Described', attachments: invoiceAttachments.slice(0, 1) }),
      );
      const captured = await mail.waitFor((m) => m.subject === 'Described');

      const listed = (await (await page('/api/messages')).json()) as { attachments: unknown }[];
      const one = (await (await page(`/api/messages/${captured.id}`)).json()) as { attachments: unknown };

      const described = [
        {
          filename: 'INV-000042.pdf',
          contentType: 'application/pdf',
          size: binary.length,
          url: `/messages/${captured.id}/attachments/0`,
        },
      ];
      expect(one.attachments).toEqual(described);
      expect(listed[0]!.attachments).toEqual(described);
    });

    it('answers 404 for a message it does not have', async () => {
      const response = await page('/messages/%E0%A4%A');

      expect(response.status).toBe(404);
    });

    it('serves the messages as JSON, newest first', async () => {
      await transport.sendMail(alertMail({ subject: 'Older' }));
      await transport.sendMail(alertMail({ subject: 'Newer' }));
      await mail.waitFor((m) => m.subject === 'Newer');

      const response = await page('/api/messages');
      const body = (await response.json()) as CapturedMail[];

      expect(response.headers.get('content-type')).toBe('application/json; charset=utf-8');
      expect(body.map((m) => m.subject)).toEqual(['Newer', 'Older']);
    });
  });

  it('listens on loopback only', async () => {
    await expect(startMailServer({ host: '0.0.0.0', smtpPort: 0 })).rejects.toThrow(/loopback only/);
  });
});
