import { RateLimiterRedis } from 'rate-limiter-flexible';
import { getDataSource } from '../lib/data-source';
import { env } from '../lib/env';
import { TooManyRequests } from '../lib/errors';
import { burnVerifyTime, verifyPassword } from '../lib/passwords';
import { getRedis } from '../lib/redis';
import { User } from '../entities/user';

let limiters: { account: RateLimiterRedis; address: RateLimiterRedis } | undefined;

function getLimiters() {
  if (!limiters) {
    const e = env();
    const common = { storeClient: getRedis(), duration: e.SIGN_IN_WINDOW_S, keyPrefix: 'lamella:signin' };
    limiters = {
      account: new RateLimiterRedis({ ...common, keyPrefix: `${common.keyPrefix}:acct`, points: e.SIGN_IN_LIMIT_PER_ACCOUNT }),
      address: new RateLimiterRedis({ ...common, keyPrefix: `${common.keyPrefix}:addr`, points: e.SIGN_IN_LIMIT_PER_ADDRESS }),
    };
  }
  return limiters;
}

export function resetAuthLimiters() {
  limiters = undefined;
}

function tooMany(msBeforeNext: number): never {
  const retryAfterS = Math.max(1, Math.ceil(msBeforeNext / 1000));
  throw new TooManyRequests(`Too many sign-in attempts. Try again in ${Math.ceil(retryAfterS / 60)} min.`, retryAfterS);
}

/**
 * Checks an e-mail and password. Failed attempts count against the account and the address;
 * the answer for an unknown e-mail and a wrong password is the same, and takes the same time.
 */
export async function authenticate(email: string, password: string, address: string): Promise<User | null> {
  const { account, address: byAddress } = getLimiters();
  const [acct, addr] = await Promise.all([account.get(email), byAddress.get(address)]);
  if (acct && acct.consumedPoints >= env().SIGN_IN_LIMIT_PER_ACCOUNT) tooMany(acct.msBeforeNext);
  if (addr && addr.consumedPoints >= env().SIGN_IN_LIMIT_PER_ADDRESS) tooMany(addr.msBeforeNext);

  const user = await getDataSource().getRepository(User).findOneBy({ email });
  const ok = user ? await verifyPassword(user.passwordHash, password) : (await burnVerifyTime(password), false);
  if (ok) {
    await account.delete(email);
    return user;
  }
  await Promise.all([account.penalty(email, 1), byAddress.penalty(address, 1)]);
  return null;
}
