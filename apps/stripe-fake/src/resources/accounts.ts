import type { Api } from '../app';
import { allowParams, invalid, mergeMetadata, nullableStr, obj, oneOf, refused, requireStr, str } from '../errors';
import type { Fake } from '../fake';
import { newId, paginate } from '../store';
import type { Account } from '../types';

function platformOnly(fake: Fake, account: string): void {
  if (account !== fake.store.platform) throw refused('Only the platform can manage connected accounts; drop the Stripe-Account header.');
}

/** What the onboarding page's button does: the account can take charges, and the platform hears `account.updated`. */
export function completeOnboarding(fake: Fake, account: Account): Account {
  const previous = { charges_enabled: account.charges_enabled, details_submitted: account.details_submitted, payouts_enabled: account.payouts_enabled };
  account.charges_enabled = true;
  account.details_submitted = true;
  account.payouts_enabled = true;
  fake.webhooks.emit(account.id, 'account.updated', account, { previous });
  fake.changed();
  return account;
}

export function registerAccounts(api: Api): void {
  api.post('/v1/accounts', ({ fake, account, params }) => {
    platformOnly(fake, account);
    allowParams(params, ['type', 'country', 'email', 'business_profile', 'metadata', 'default_currency', 'capabilities', 'controller', 'business_type']);
    const profile = obj(params, 'business_profile') ?? {};
    const created = fake.store.put<Account>(fake.store.platform, {
      id: newId('acct'),
      object: 'account',
      created: fake.nowSec(),
      livemode: false,
      type: oneOf(str(params, 'type'), ['standard', 'express', 'custom'], 'type') ?? 'standard',
      country: str(params, 'country') ?? 'US',
      email: str(params, 'email') ?? null,
      default_currency: str(params, 'default_currency') ?? 'usd',
      business_profile: { name: nullableStr(profile, 'name', 'business_profile[name]') ?? null, url: nullableStr(profile, 'url', 'business_profile[url]') ?? null },
      charges_enabled: false,
      details_submitted: false,
      payouts_enabled: false,
      metadata: mergeMetadata({}, params),
    });
    return created;
  });

  api.get('/v1/accounts/:id', ({ fake, account, path }) => {
    platformOnly(fake, account);
    return fake.store.get<Account>(fake.store.platform, path.id ?? '', 'account', 'account', 'account');
  });

  api.post('/v1/accounts/:id', ({ fake, account, params, path }) => {
    platformOnly(fake, account);
    allowParams(params, ['email', 'business_profile', 'metadata']);
    const target = fake.store.get<Account>(fake.store.platform, path.id ?? '', 'account', 'account', 'account');
    const previous: Record<string, unknown> = {};
    const email = nullableStr(params, 'email');
    if (email !== undefined) {
      previous.email = target.email;
      target.email = email;
    }
    const profile = obj(params, 'business_profile');
    if (profile) {
      previous.business_profile = { ...target.business_profile };
      const name = nullableStr(profile, 'name', 'business_profile[name]');
      const url = nullableStr(profile, 'url', 'business_profile[url]');
      if (name !== undefined) target.business_profile.name = name;
      if (url !== undefined) target.business_profile.url = url;
    }
    if (params.metadata !== undefined) {
      previous.metadata = target.metadata;
      target.metadata = mergeMetadata(target.metadata, params);
    }
    fake.webhooks.emit(target.id, 'account.updated', target, { previous });
    return target;
  });

  api.get('/v1/accounts', ({ fake, account, params }) => {
    platformOnly(fake, account);
    return paginate(fake.store.all<Account>(fake.store.platform, 'account'), params, '/v1/accounts');
  });

  api.post('/v1/account_links', ({ fake, account, params }) => {
    platformOnly(fake, account);
    allowParams(params, ['account', 'refresh_url', 'return_url', 'type', 'collect', 'collection_options']);
    const target = fake.store.get<Account>(fake.store.platform, requireStr(params, 'account'), 'account', 'account', 'account');
    const type = requireStr(params, 'type');
    if (type !== 'account_onboarding' && type !== 'account_update') throw invalid(`Invalid type: must be one of account_onboarding, account_update`, 'type');
    const query = new URLSearchParams();
    const returnUrl = str(params, 'return_url');
    const refreshUrl = str(params, 'refresh_url');
    if (returnUrl) query.set('return_url', returnUrl);
    if (refreshUrl) query.set('refresh_url', refreshUrl);
    const created = fake.nowSec();
    // Real account links expire after a few minutes; the fake's page stays usable, so expires_at is informative only.
    return { object: 'account_link', created, expires_at: created + 300, url: `${fake.baseUrl}/onboarding/${target.id}?${query.toString()}` };
  });
}
