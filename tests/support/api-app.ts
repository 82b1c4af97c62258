// The one set-up of an API test file that works as signed-in people of a winery:
//
//   const app = setupApiApp({ wineryName: 'Runs Test Winery', members: true, world: 'filled' });
//
// It registers the beforeAll/afterAll hooks that start the test app, sign up the owner (and, if
// asked, a second winery's owner and one member per other role), build the plan world, and close
// the app afterwards. The answer is the running TestApp (baseUrl, db, mail …) plus what was set
// up: `app.owner`, `app.wineryId`, `app.other`, `app.members.technician`, `app.world`. A file
// that needs more rows registers its own beforeAll after this call (hooks run in order).
import { afterAll, beforeAll } from 'vitest';
import type { AppConfig } from '../../server/app';
import type { Role } from '../../shared/permissions';
import type { TenantContext } from '../../server/middleware/authorize';
import { createPlanWorld, fillTrainHousings, stockPlanWorld, type PlanWorld } from '../factories/plans';
import { addMember, signUp, startTestApp, type Client, type TestApp } from './test-app';

export type MemberRole = Exclude<Role, 'owner'>;
/** Every role but the owner's, in the order the tests invite them. */
export const MEMBER_ROLES: readonly MemberRole[] = ['cellar-master', 'winemaker', 'technician', 'auditor'];
/** One signed-in member of the owner's winery per role. */
export type Members = Record<MemberRole, Client>;

type SignedUp = Awaited<ReturnType<typeof signUp>>;

/** The owner's tenant, as a route hands it to a service (for service tests calling `createXService(app.db)`). */
export const ownerTenant = (me: SignedUp['me']): TenantContext => ({
  wineryId: me.activeWineryId!,
  role: 'owner',
  userId: me.user.id,
  userName: me.user.name,
});

export type ApiAppOptions = {
  /** The owner's winery; without it no one signs up. */
  wineryName?: string;
  /** A second owner with a winery of their own (the "another winery gets 404" checks). */
  otherWineryName?: string;
  /** Invite one person per role into the owner's winery: every other role (`true`) or the roles named. */
  members?: true | readonly MemberRole[];
  /**
   * The owner's plan world (`createPlanWorld`): `bare`; `stocked`, with 12 cartridges of each
   * type registered; `filled`, its housings filled with the planned cartridges so runs start.
   */
  world?: 'bare' | 'stocked' | 'filled';
  /** Also start a fake S3 server. */
  withStorage?: boolean;
  /** App settings for this file (e.g. `{ answerCacheBytes: 0 }` to test what lies under the kept answers). */
  config?: Partial<AppConfig>;
};

export type ApiApp = TestApp & {
  readonly owner: Client;
  readonly ownerEmail: string;
  readonly ownerMe: SignedUp['me'];
  /** The owner's winery. */
  readonly wineryId: string;
  readonly other: Client;
  readonly otherWineryId: string;
  readonly members: Members;
  /** The e-mail address of each invited member (for mail checks). */
  readonly memberEmails: Record<MemberRole, string>;
  readonly world: PlanWorld;
};

type SetUp = {
  app: TestApp;
  owner?: SignedUp;
  other?: SignedUp;
  members: Partial<Members>;
  memberEmails: Partial<Record<MemberRole, string>>;
  world?: PlanWorld;
};

/**
 * Registers beforeAll (start the app, sign up, invite, build the world) and afterAll (close the
 * app). Call it at the top of the file; use the answer inside the tests and later hooks.
 */
export function setupApiApp(opts: ApiAppOptions = {}): ApiApp {
  let done: SetUp | undefined;
  beforeAll(async () => {
    const app = await startTestApp({ withStorage: opts.withStorage, config: opts.config });
    const setUp: SetUp = { app, members: {}, memberEmails: {} };
    done = setUp;
    if (opts.wineryName !== undefined) setUp.owner = await signUp(app.baseUrl, { wineryName: opts.wineryName });
    if (opts.otherWineryName !== undefined) setUp.other = await signUp(app.baseUrl, { wineryName: opts.otherWineryName });
    const roles = opts.members === true ? MEMBER_ROLES : (opts.members ?? []);
    for (const role of roles) {
      const member = await addMember(app, need(setUp.owner, 'wineryName').client, role);
      setUp.members[role] = member.client;
      setUp.memberEmails[role] = member.email;
    }
    if (opts.world) {
      const owner = need(setUp.owner, 'wineryName').client;
      setUp.world = await createPlanWorld(owner);
      if (opts.world === 'stocked') await stockPlanWorld(owner, setUp.world);
      if (opts.world === 'filled') await fillTrainHousings(owner, setUp.world);
    }
  });
  afterAll(async () => {
    await done?.app.close();
  });
  const started = () => {
    if (!done) throw new Error('setupApiApp: the app is used before its beforeAll ran (use it inside a test or a later hook)');
    return done;
  };
  const members = new Proxy({} as Members, {
    get: (_, role) => need(started().members[role as MemberRole], `members including ${String(role)}`),
  });
  const memberEmails = new Proxy({} as Record<MemberRole, string>, {
    get: (_, role) => need(started().memberEmails[role as MemberRole], `members including ${String(role)}`),
  });
  const answer = {
    get owner() {
      return need(started().owner, 'wineryName').client;
    },
    get ownerEmail() {
      return need(started().owner, 'wineryName').email;
    },
    get ownerMe() {
      return need(started().owner, 'wineryName').me;
    },
    get wineryId() {
      return need(started().owner, 'wineryName').me.activeWineryId!;
    },
    get other() {
      return need(started().other, 'otherWineryName').client;
    },
    get otherWineryId() {
      return need(started().other, 'otherWineryName').me.activeWineryId!;
    },
    members,
    memberEmails,
    get world() {
      return need(started().world, 'world');
    },
  };
  // The running TestApp's own fields, read through once the app has started.
  for (const key of ['baseUrl', 'mail', 'db', 'pool', 'queue', 'alerts', 'answers', 'close'] as const) {
    Object.defineProperty(answer, key, { enumerable: true, get: () => started().app[key] });
  }
  return answer as ApiApp;
}

function need<T>(value: T | undefined, option: string): T {
  if (value === undefined) throw new Error(`setupApiApp: this file did not ask for it (option ${option})`);
  return value;
}
