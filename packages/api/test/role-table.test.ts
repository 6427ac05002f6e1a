/**
 * The role table of architecture.md, route by route and role by role. The expectations are
 * written from the table itself, not from the policy module, so a drift in either shows.
 *
 * | action                                        | viewer | reviewer | editor | owner | site admin |
 * | read notebook, fork it                        |   ✓    |    ✓     |   ✓    |   ✓   |     ✓      |
 * | pin / comment / sign off a review             |        |    ✓     |   ✓    |   ✓   |            |
 * | edit cells, make versions                     |        |          |   ✓    |   ✓   |            |
 * | share, change roles, delete notebook          |        |          |        |   ✓   |            |
 * A link-shared notebook makes any signed-in user a viewer. No access at all → 404.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { connect, disconnect } from '../src/db/connection.js';
import type { User } from '../src/db/entities/user.js';
import { deleteCell } from '../src/services/cells.js';
import { deleteNotebook } from '../src/services/notebooks.js';
import { createPin } from '../src/services/pins.js';
import { requestReview } from '../src/services/reviews.js';
import { Client, signedIn } from './client.js';
import { buildNotebook, buildUser } from './factories.js';
import { startTestServer } from './http.js';
import type { TestServer } from './http.js';

type Role = 'owner' | 'editor' | 'reviewer' | 'viewer' | 'link viewer' | 'site admin' | 'stranger' | 'signed out';
type Action = 'read' | 'fork' | 'review' | 'edit' | 'share' | 'delete';

const roles: Role[] = ['owner', 'editor', 'reviewer', 'viewer', 'link viewer', 'site admin', 'stranger', 'signed out'];

const granted: Record<Action, Role[]> = {
  read: ['viewer', 'reviewer', 'editor', 'owner', 'site admin', 'link viewer'],
  fork: ['viewer', 'reviewer', 'editor', 'owner', 'site admin', 'link viewer'],
  review: ['reviewer', 'editor', 'owner'],
  edit: ['editor', 'owner'],
  share: ['owner'],
  delete: ['owner'],
};

type Notebook = Awaited<ReturnType<typeof buildNotebook>>;

interface RouteCase {
  route: string;
  action: Action;
  /** The status of a permitted call. */
  ok: number;
  /** The notebook is deleted first: only its owner still sees it. */
  deleted?: boolean;
  prepare?: (notebook: Notebook, owner: User) => Promise<void>;
  call: (client: Client, notebook: Notebook, people: People) => ReturnType<Client['get']>;
}

interface People {
  newcomer: User;
  viewer: User;
  reviewer: User;
}

const cell = (notebook: Notebook) => notebook.cells[1]!;
const base = (notebook: Notebook) => `/api/notebooks/${notebook.id}`;
const actorOf = (user: User) => ({ id: user.id, siteRole: user.siteRole, disabled: user.disabled });
/** The pin or review round a route case made in `prepare`, by notebook. */
const made = new Map<string, number>();
const makePin = async (n: Notebook, owner: User) => {
  const pin = await createPin(await connect(), actorOf(owner), n.id, { cellId: cell(n).id, trace: 'out', frequency: 1000, body: 'Corner?' });
  made.set(n.id, pin.id);
};
const makeReview = async (n: Notebook, owner: User) => {
  const { review } = await requestReview(await connect(), actorOf(owner), n.id, { reviewerIds: [users.get('reviewer')!.id], message: '' });
  made.set(n.id, review.id);
};

const routes: RouteCase[] = [
  { route: 'GET /notebooks/:id', action: 'read', ok: 200, call: (c, n) => c.get(base(n)) },
  { route: 'GET …/cells/:cellId/revisions', action: 'read', ok: 200, call: (c, n) => c.get(`${base(n)}/cells/${cell(n).id}/revisions`) },
  { route: 'GET …/cells/:cellId/revisions/1', action: 'read', ok: 200, call: (c, n) => c.get(`${base(n)}/cells/${cell(n).id}/revisions/1`) },
  { route: 'GET …/versions', action: 'read', ok: 200, call: (c, n) => c.get(`${base(n)}/versions`) },
  {
    route: 'GET …/versions/1',
    action: 'read',
    ok: 200,
    prepare: async (n) => {
      const owner = await signedIn(server.url, n.ownerUser.login);
      expect((await owner.post(`${base(n)}/versions`, { label: 'v1' })).status).toBe(201);
    },
    call: (c, n) => c.get(`${base(n)}/versions/1`),
  },
  { route: 'GET …/forks', action: 'read', ok: 200, call: (c, n) => c.get(`${base(n)}/forks`) },
  { route: 'GET …/members', action: 'read', ok: 200, call: (c, n) => c.get(`${base(n)}/members`) },
  { route: 'POST …/forks', action: 'fork', ok: 201, call: (c, n) => c.post(`${base(n)}/forks`, {}) },
  { route: 'GET …/pins', action: 'read', ok: 200, call: (c, n) => c.get(`${base(n)}/pins`) },
  { route: 'GET …/reviews', action: 'read', ok: 200, call: (c, n) => c.get(`${base(n)}/reviews`) },
  { route: 'GET …/reviews/:reviewId', action: 'read', ok: 200, prepare: makeReview, call: (c, n) => c.get(`${base(n)}/reviews/${made.get(n.id)}`) },
  { route: 'GET …/activity', action: 'read', ok: 200, call: (c, n) => c.get(`${base(n)}/activity`) },
  {
    route: 'POST …/pins',
    action: 'review',
    ok: 201,
    call: (c, n) => c.post(`${base(n)}/pins`, { cellId: cell(n).id, trace: 'out', frequency: 1591.5, body: 'Corner here?' }),
  },
  {
    route: 'POST …/pins/:pinId/comments',
    action: 'review',
    ok: 201,
    prepare: makePin,
    call: (c, n) => c.post(`${base(n)}/pins/${made.get(n.id)}/comments`, { body: 'Agreed.' }),
  },
  { route: 'POST …/pins/:pinId/resolve', action: 'review', ok: 200, prepare: makePin, call: (c, n) => c.post(`${base(n)}/pins/${made.get(n.id)}/resolve`) },
  { route: 'POST …/pins/:pinId/reopen', action: 'review', ok: 200, prepare: makePin, call: (c, n) => c.post(`${base(n)}/pins/${made.get(n.id)}/reopen`) },
  { route: 'PATCH /notebooks/:id (title)', action: 'edit', ok: 200, call: (c, n) => c.patch(base(n), { title: 'Renamed' }) },
  {
    route: 'PATCH /notebooks/:id (description)',
    action: 'edit',
    ok: 200,
    call: (c, n) => c.patch(base(n), { description: 'Second try, with a damping arm.' }),
  },
  { route: 'POST …/cells', action: 'edit', ok: 201, call: (c, n) => c.post(`${base(n)}/cells`, { kind: 'note', text: 'added' }) },
  {
    route: 'PUT …/cells/:cellId',
    action: 'edit',
    ok: 201,
    call: (c, n) => c.put(`${base(n)}/cells/${cell(n).id}`, { text: `${cell(n).text}# edit\n`, baseRevision: 1 }),
  },
  { route: 'POST …/cells/:cellId/move', action: 'edit', ok: 200, call: (c, n) => c.post(`${base(n)}/cells/${cell(n).id}/move`, { position: 0 }) },
  { route: 'DELETE …/cells/:cellId', action: 'edit', ok: 200, call: (c, n) => c.delete(`${base(n)}/cells/${cell(n).id}`) },
  {
    route: 'POST …/cells/:cellId/restore',
    action: 'edit',
    ok: 200,
    prepare: async (n, owner) => {
      await deleteCell(await connect(), actorOf(owner), n.id, cell(n).id);
    },
    call: (c, n) => c.post(`${base(n)}/cells/${cell(n).id}/restore`),
  },
  { route: 'POST …/versions', action: 'edit', ok: 201, call: (c, n) => c.post(`${base(n)}/versions`, { label: 'Review copy' }) },
  // Asking for a review makes a version, so it takes `edit`; the reviewer is asked, never the caller.
  { route: 'POST …/reviews', action: 'edit', ok: 201, call: (c, n, p) => c.post(`${base(n)}/reviews`, { reviewerIds: [p.reviewer.id] }) },
  { route: 'PATCH /notebooks/:id (visibility)', action: 'share', ok: 200, call: (c, n) => c.patch(base(n), { visibility: 'link' }) },
  { route: 'PUT …/members/:userId', action: 'share', ok: 201, call: (c, n, p) => c.put(`${base(n)}/members/${p.newcomer.id}`, { role: 'viewer' }) },
  { route: 'DELETE …/members/:userId', action: 'share', ok: 204, call: (c, n, p) => c.delete(`${base(n)}/members/${p.viewer.id}`) },
  { route: 'DELETE /notebooks/:id', action: 'delete', ok: 204, call: (c, n) => c.delete(base(n)) },
  { route: 'POST /notebooks/:id/restore', action: 'delete', ok: 200, call: (c, n) => c.post(`${base(n)}/restore`) },
  { route: 'GET /notebooks/:id of a deleted notebook', action: 'read', ok: 200, deleted: true, call: (c, n) => c.get(base(n)) },
  { route: 'POST …/restore of a deleted notebook', action: 'delete', ok: 200, deleted: true, call: (c, n) => c.post(`${base(n)}/restore`) },
  { route: 'POST …/forks of a deleted notebook', action: 'fork', ok: 201, deleted: true, call: (c, n) => c.post(`${base(n)}/forks`, {}) },
];

/** What the role table (and "no access → 404") says a call should answer. */
function expectedStatus(route: RouteCase, role: Role): number {
  if (role === 'signed out') return 401;
  // A deleted notebook is visible to its owner alone, who may only read and restore it.
  if (route.deleted) {
    if (role !== 'owner') return 404;
    return route.action === 'read' || route.action === 'delete' ? route.ok : 403;
  }
  if (granted[route.action].includes(role)) return route.ok;
  return granted.read.includes(role) ? 403 : 404;
}

let server: TestServer;
const clients = new Map<Role, Client>();
const users = new Map<Role, User>();

beforeAll(async () => {
  server = await startTestServer();
  for (const role of ['owner', 'editor', 'reviewer', 'viewer', 'link viewer', 'stranger'] as const) users.set(role, await buildUser());
  users.set('site admin', await buildUser({ siteRole: 'admin' }));
  for (const [role, user] of users) clients.set(role, await signedIn(server.url, user.login));
  clients.set('signed out', new Client(server.url));
});

afterAll(async () => {
  await server.close();
  await disconnect();
});

describe('the role table, every route × every role', () => {
  for (const route of routes) {
    describe(route.route, () => {
      for (const role of roles) {
        const status = expectedStatus(route, role);
        it(`${role} → ${status}`, async () => {
          const owner = users.get('owner')!;
          const viewer = users.get('viewer')!;
          const notebook = await buildNotebook({
            owner,
            members: [
              [users.get('editor')!, 'editor'],
              [users.get('reviewer')!, 'reviewer'],
              [viewer, 'viewer'],
            ],
            visibility: role === 'link viewer' ? 'link' : 'private',
          });
          await route.prepare?.(notebook, owner);
          if (route.deleted) await deleteNotebook(await connect(), actorOf(owner), notebook.id);
          const reply = await route.call(clients.get(role)!, notebook, { newcomer: await buildUser(), viewer, reviewer: users.get('reviewer')! });
          expect(reply.status, JSON.stringify(reply.body)).toBe(status);
          if (status === 404) expect(reply.body).toMatchObject({ error: 'not_found', message: 'The notebook was not found.' });
          if (status === 403) expect(reply.body).toMatchObject({ error: 'forbidden' });
          if (status === 401) expect(reply.body).toMatchObject({ error: 'unauthenticated' });
        });
      }
    });
  }
});

describe('site actions', () => {
  for (const role of roles) {
    const status = role === 'site admin' ? 200 : role === 'signed out' ? 401 : 403;
    it(`GET /api/admin/users as ${role} → ${status}`, async () => {
      expect((await clients.get(role)!.get('/api/admin/users')).status).toBe(status);
    });
  }
});

describe('a stranger learns nothing about a private notebook', () => {
  it('gets the same 404 for a private notebook as for one that does not exist', async () => {
    const notebook = await buildNotebook();
    const stranger = clients.get('stranger')!;
    const real = await stranger.get(`/api/notebooks/${notebook.id}`);
    const missing = await stranger.get('/api/notebooks/AAAAAAAAAAAA');
    expect(real.status).toBe(404);
    expect(real.body).toEqual(missing.body);
  });
});
