import type { InviteUserBody, ListUsersQuery, UpdateUserBody, UserSummary } from '../../shared/admin';
import type { Page } from '../../shared/paging';
import type { AppContext } from '../app-context';
import { AuthService } from '../auth/auth.service';
import { endSessionsOf } from '../auth/session-revocation';
import { User } from '../auth/user.entity';
import { toUserSummary } from '../auth/user.mapper';
import { AppError } from '../http/app-error';

const SORT_COLUMNS: Record<ListUsersQuery['sort'], string> = {
  email: 'u.email',
  displayName: 'u.display_name',
  createdAt: 'u.created_at',
  lastSignInAt: 'u.last_sign_in_at',
};

/** Site administration of accounts: list, invite, change, deactivate, send reset links. */
export class AdminUsersService {
  private readonly auth: AuthService;

  constructor(private readonly ctx: AppContext) {
    this.auth = new AuthService(ctx);
  }

  private get users() {
    return this.ctx.dataSource.getRepository(User);
  }

  async list(query: ListUsersQuery): Promise<Page<UserSummary>> {
    const qb = this.users.createQueryBuilder('u');
    if (query.q) qb.where('(u.email ILIKE :q OR u.display_name ILIKE :q)', { q: `%${query.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%` });
    const [rows, total] = await qb
      .orderBy(SORT_COLUMNS[query.sort], query.dir === 'asc' ? 'ASC' : 'DESC', 'NULLS LAST')
      .addOrderBy('u.id', 'ASC')
      .skip(query.page * query.pageSize)
      .take(query.pageSize)
      .getManyAndCount();
    return { items: rows.map(toUserSummary), total, page: query.page, pageSize: query.pageSize };
  }

  async invite(admin: Express.User, body: InviteUserBody): Promise<UserSummary> {
    if (await this.users.existsBy({ email: body.email })) {
      throw new AppError(409, 'conflict', `An account for ${body.email} already exists.`, [{ field: 'body.email', message: 'This address already has an account.' }]);
    }
    const user = await this.users.save(this.users.create({ ...body, passwordHash: null, active: true }));
    await this.auth.sendInvitation(user, admin.displayName);
    return toUserSummary(user);
  }

  async update(admin: Express.User, userId: string, body: UpdateUserBody): Promise<UserSummary> {
    const user = await this.find(userId);
    if (user.id === admin.id && (body.active === false || body.siteRole === 'member')) {
      throw AppError.conflict('You cannot deactivate yourself or remove your own admin role; ask another administrator.');
    }
    await this.users.update({ id: userId }, body);
    if (body.active === false) await endSessionsOf(this.ctx.dataSource, userId);
    return toUserSummary(await this.find(userId));
  }

  /** Sends a reset link, or a fresh invitation to someone who never set a password. */
  async sendReset(admin: Express.User, userId: string): Promise<void> {
    const user = await this.find(userId);
    if (!user.active) throw AppError.conflict('This account is deactivated; reactivate it first.');
    if (user.passwordHash === null) await this.auth.sendInvitation(user, admin.displayName);
    else await this.auth.sendResetLink(user);
  }

  private async find(userId: string): Promise<User> {
    const user = await this.users.findOneBy({ id: userId });
    if (!user) throw AppError.notFound('The user');
    return user;
  }
}
