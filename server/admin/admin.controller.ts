import type { RequestHandler } from 'express';
import type { InviteUserBody, ListUsersQuery, UpdateUserBody } from '../../shared/admin';
import type { AppContext } from '../app-context';
import { AppError } from '../http/app-error';
import { currentUser } from '../http/require-auth';
import { AdminUsersService } from './admin-users.service';
import { readOutbox } from './mail-outbox';

/** HTTP in, service call, HTTP out for site administration. */
export class AdminController {
  private readonly users: AdminUsersService;

  constructor(private readonly ctx: AppContext) {
    this.users = new AdminUsersService(ctx);
  }

  listUsers: RequestHandler = async (req, res) => {
    res.json(await this.users.list(req.query as unknown as ListUsersQuery));
  };

  inviteUser: RequestHandler = async (req, res) => {
    res.status(201).json(await this.users.invite(currentUser(req), req.body as InviteUserBody));
  };

  updateUser: RequestHandler = async (req, res) => {
    res.json(await this.users.update(currentUser(req), String(req.params['userId']), req.body as UpdateUserBody));
  };

  sendReset: RequestHandler = async (req, res) => {
    await this.users.sendReset(currentUser(req), String(req.params['userId']));
    res.status(202).json({ message: 'A link to set a password has been sent.' });
  };

  /** The fake SMTP server's kept messages exist only in local mode. */
  mail: RequestHandler = async (_req, res) => {
    if (!this.ctx.config.smtp.fake) throw new AppError(404, 'not_found', 'The mail outbox exists only in local mode.');
    res.json(await readOutbox(this.ctx.config.storageDir));
  };
}
