import nodemailer, { type Transporter } from 'nodemailer';
import type { Logger } from 'pino';
import type { Config } from '../config';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
}

/** Sends mail over SMTP: the local fake server in local mode, any relay in production. */
export class Mailer {
  private readonly transport: Transporter;

  constructor(
    private readonly smtp: Config['smtp'],
    private readonly logger: Logger,
  ) {
    this.transport = nodemailer.createTransport({
      host: smtp.host,
      port: smtp.port,
      secure: smtp.secure,
      // The local fake server speaks plain SMTP on loopback; a real relay negotiates TLS as usual.
      ignoreTLS: smtp.fake,
      auth: smtp.user ? { user: smtp.user, pass: smtp.password ?? '' } : undefined,
      connectionTimeout: 5000,
    });
  }

  async send(mail: OutgoingMail): Promise<void> {
    await this.transport.sendMail({ from: this.smtp.from, ...mail });
    this.logger.info({ to: mail.to, subject: mail.subject }, 'mail sent');
  }

  /**
   * For mail whose loss the user can recover from by asking again (reset links):
   * a relay that is down is logged and does not fail the request.
   */
  async sendOrLog(mail: OutgoingMail): Promise<boolean> {
    try {
      await this.send(mail);
      return true;
    } catch (err) {
      // Catches SMTP connection and delivery failures only; the caller's work is already saved.
      this.logger.error({ err, to: mail.to, subject: mail.subject }, 'mail could not be sent');
      return false;
    }
  }

  close(): void {
    this.transport.close();
  }
}
