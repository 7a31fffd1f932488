import nodemailer from 'nodemailer';

export interface MailAttachment {
  filename: string;
  content: Buffer;
  contentType: string;
}

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  html: string;
  headers?: Record<string, string>;
  attachments?: MailAttachment[];
}

export interface Mailer {
  send(mail: OutgoingMail): Promise<void>;
}

/** SMTP through nodemailer: the local stand-in in the demo and tests, a real relay by configuration. */
export function createMailer(options: { host: string; port: number; from: string }): Mailer {
  const transport = nodemailer.createTransport({
    host: options.host,
    port: options.port,
    secure: false,
    // The loopback stand-in speaks plain SMTP; a real relay offers STARTTLS and gets it.
    ignoreTLS: options.host === '127.0.0.1' || options.host === 'localhost',
    connectionTimeout: 5_000,
    greetingTimeout: 5_000,
  });
  return {
    async send(mail) {
      await transport.sendMail({ from: options.from, ...mail });
    },
  };
}
