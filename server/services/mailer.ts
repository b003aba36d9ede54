import nodemailer, { type Transporter } from 'nodemailer';

export interface OutgoingMail {
  to: string | string[];
  subject: string;
  text: string;
  html?: string;
  attachments?: { filename: string; content: Buffer; contentType: string; cid?: string }[];
}

export interface Mailer {
  send(mail: OutgoingMail): Promise<void>;
  close(): void;
}

/** SMTP through nodemailer; on this machine the host is the local fake receiver. */
export function createMailer(opts: { host: string; port: number; from: string }): Mailer {
  const transport: Transporter = nodemailer.createTransport({
    host: opts.host,
    port: opts.port,
    secure: false,
    ignoreTLS: opts.host === '127.0.0.1' || opts.host === 'localhost',
  });
  return {
    async send(mail) {
      await transport.sendMail({ from: opts.from, ...mail });
    },
    close: () => transport.close(),
  };
}
