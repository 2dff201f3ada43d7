import { expect } from 'chai';
import { ApiClient, mountApp } from '../../support/api-client';
import { makeUser, TEST_PASSWORD } from '../../support/fixtures';
import { testConfig } from '../../support/test-config';
import { sessionCount, userState } from '../db-state';
import { expectApiError } from '../error-shape';

describe('auth: sign-in rate limits', () => {
  // An app of its own, so the limiter's counters start empty.
  let app: Awaited<ReturnType<typeof mountApp>>;
  before(async () => (app = await mountApp()));
  after(() => app.close());

  async function failSignIns(client: ApiClient, email: string, times: number): Promise<number[]> {
    const statuses: number[] = [];
    for (let i = 0; i < times; i++) statuses.push((await client.signIn(email, `wrong-password-${i}`)).status);
    return statuses;
  }

  it(`when one e-mail has failed ${testConfig.signInLimit.max} times, then the next attempt is 429 with a message to wait`, async () => {
    const user = await makeUser();
    const client = new ApiClient(app.url);

    const statuses = await failSignIns(client, user.email, testConfig.signInLimit.max);
    const next = await client.signIn(user.email, 'yet-another-guess');

    expect(statuses).to.deep.equal(Array(testConfig.signInLimit.max).fill(401));
    expect(expectApiError(next, 429, 'too_many_requests').message).to.match(/wait \d+ minutes?/i);
  });

  it('when an e-mail is blocked, then even the right password is refused and no session is made', async () => {
    const user = await makeUser();
    const client = new ApiClient(app.url);
    await failSignIns(client, user.email, testConfig.signInLimit.max);
    const before = await userState(user.id);

    const res = await client.signIn(user.email, TEST_PASSWORD);

    expectApiError(res, 429, 'too_many_requests');
    expect(await sessionCount(user.id)).to.equal(0);
    expect(await userState(user.id)).to.deep.equal(before);
  });

  it('when the blocked e-mail is sent in other letter case, then it is still blocked', async () => {
    const user = await makeUser();
    const client = new ApiClient(app.url);
    await failSignIns(client, user.email, testConfig.signInLimit.max);

    const res = await client.signIn(user.email.toUpperCase(), TEST_PASSWORD);

    expectApiError(res, 429, 'too_many_requests');
  });

  it('when one e-mail is blocked, then a different e-mail from the same address can still sign in', async () => {
    const blocked = await makeUser();
    const other = await makeUser();
    const client = new ApiClient(app.url);
    await failSignIns(client, blocked.email, testConfig.signInLimit.max);
    expect((await client.signIn(blocked.email, TEST_PASSWORD)).status).to.equal(429);

    const res = await new ApiClient(app.url).signIn(other.email, TEST_PASSWORD);

    expect(res.status).to.equal(200);
    expect(res.body.user?.id).to.equal(other.id);
  });

  it('when successful sign-ins are repeated, then they do not count towards the limit', async () => {
    const user = await makeUser();
    for (let i = 0; i < testConfig.signInLimit.max + 1; i++) {
      expect((await new ApiClient(app.url).signIn(user.email, TEST_PASSWORD)).status).to.equal(200);
    }
    const failures = await failSignIns(new ApiClient(app.url), user.email, testConfig.signInLimit.max - 1);
    expect(failures.every((s) => s === 401)).to.equal(true);
    expect((await new ApiClient(app.url).signIn(user.email, TEST_PASSWORD)).status).to.equal(200);
  });
});
