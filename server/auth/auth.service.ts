import type { ChangePasswordBody, CheckResetBody, CompleteResetBody } from '../../shared/auth';
import type { AppContext } from '../app-context';
import { AppError } from '../http/app-error';
import { hashPassword, passwordMatches } from './password-hash';
import { checkPasswordToken, consumePasswordToken, issuePasswordToken } from './password-links';
import { endSessionsOf } from './session-revocation';
import { User } from './user.entity';

/** Password rules: change, reset by e-mailed link, invitation links. */
export class AuthService {
  constructor(private readonly ctx: AppContext) {}

  private get users() {
    return this.ctx.dataSource.getRepository(User);
  }

  async recordSignIn(userId: string): Promise<void> {
    await this.users.update({ id: userId }, { lastSignInAt: new Date() });
  }

  async changePassword(userId: string, body: ChangePasswordBody, currentSid: string): Promise<void> {
    const user = await this.users.findOneByOrFail({ id: userId });
    if (!(await passwordMatches(user.passwordHash, body.currentPassword))) {
      throw new AppError(422, 'validation_failed', 'The current password is wrong.', [
        { field: 'body.currentPassword', message: 'The current password is wrong.' },
      ]);
    }
    await this.users.update({ id: userId }, { passwordHash: await hashPassword(body.newPassword) });
    await endSessionsOf(this.ctx.dataSource, userId, currentSid);
  }

  /** Always succeeds from the caller's view, so the answer never tells who has an account. */
  async requestReset(email: string): Promise<void> {
    const user = await this.users.findOneBy({ email });
    if (!user?.active) {
      this.ctx.logger.info({ email }, 'password reset asked for an unknown or inactive account');
      return;
    }
    await this.sendResetLink(user);
  }

  async sendResetLink(user: User): Promise<void> {
    const { config, dataSource, mailer } = this.ctx;
    const token = await issuePasswordToken(dataSource, user, 'reset', config.resetTokenMs);
    const minutes = Math.round(config.resetTokenMs / 60_000);
    await mailer.sendOrLog({
      to: user.email,
      subject: 'Etchfile: set a new password',
      text: [
        `Hello ${user.displayName},`,
        '',
        'Someone (we hope you) asked to set a new password for your Etchfile account.',
        `Open this link within ${minutes} minutes to choose one; it works once:`,
        '',
        `${config.publicUrl}/reset-password?token=${token}`,
        '',
        'If you did not ask for this, ignore this message; your password stays as it is.',
      ].join('\n'),
    });
  }

  async sendInvitation(user: User, invitedBy: string): Promise<void> {
    const { config, dataSource, mailer } = this.ctx;
    const token = await issuePasswordToken(dataSource, user, 'invite', config.inviteTokenMs);
    const hours = Math.round(config.inviteTokenMs / 3600_000);
    await mailer.sendOrLog({
      to: user.email,
      subject: 'Etchfile: you are invited',
      text: [
        `Hello ${user.displayName},`,
        '',
        `${invitedBy} has made you an Etchfile account for ${user.email}.`,
        `Open this link within ${hours} hours to choose your password; it works once:`,
        '',
        `${config.publicUrl}/reset-password?token=${token}`,
      ].join('\n'),
    });
  }

  async checkReset(body: CheckResetBody): Promise<void> {
    await checkPasswordToken(this.ctx.dataSource.manager, body.token);
  }

  async completeReset(body: CompleteResetBody): Promise<void> {
    const userId = await this.ctx.dataSource.transaction(async (m) => {
      const userId = await consumePasswordToken(m, body.token);
      const user = await m.findOneByOrFail(User, { id: userId });
      if (!user.active) throw new AppError(403, 'account_inactive', 'This account has been deactivated. Ask a site administrator.');
      await m.update(User, { id: userId }, { passwordHash: await hashPassword(body.newPassword) });
      return userId;
    });
    // Whoever knew the old password is signed out everywhere.
    await endSessionsOf(this.ctx.dataSource, userId);
  }
}
