/** Every API path the web calls, and every page address it links to, in one table. */
import type { NotebookListQuery } from '@rolloff/api/contract';

const enc = encodeURIComponent;

function query(params: Record<string, string | number | undefined>): string {
  const search = new URLSearchParams();
  for (const [key, value] of Object.entries(params)) if (value !== undefined && value !== '') search.set(key, String(value));
  const text = search.toString();
  return text ? `?${text}` : '';
}

export const apiPaths = {
  health: () => '/api/health',
  me: () => '/api/me',
  logout: () => '/auth/logout',
  notebooks: (params: Omit<NotebookListQuery, 'limit'> & { limit?: number } = {}) =>
    `/api/notebooks${query({ scope: params.scope, q: params.q, sort: params.sort, order: params.order, cursor: params.cursor, limit: params.limit })}`,
  notebook: (id: string) => `/api/notebooks/${enc(id)}`,
  restoreNotebook: (id: string) => `/api/notebooks/${enc(id)}/restore`,
  cells: (id: string) => `/api/notebooks/${enc(id)}/cells`,
  cell: (id: string, cellId: number) => `/api/notebooks/${enc(id)}/cells/${cellId}`,
  moveCell: (id: string, cellId: number) => `/api/notebooks/${enc(id)}/cells/${cellId}/move`,
  restoreCell: (id: string, cellId: number) => `/api/notebooks/${enc(id)}/cells/${cellId}/restore`,
  revisions: (id: string, cellId: number, cursor?: string) => `/api/notebooks/${enc(id)}/cells/${cellId}/revisions${query({ cursor, limit: 100 })}`,
  revision: (id: string, cellId: number, number: number) => `/api/notebooks/${enc(id)}/cells/${cellId}/revisions/${number}`,
  restoreRevision: (id: string, cellId: number, number: number) => `/api/notebooks/${enc(id)}/cells/${cellId}/revisions/${number}/restore`,
  versions: (id: string) => `/api/notebooks/${enc(id)}/versions`,
  version: (id: string, number: number) => `/api/notebooks/${enc(id)}/versions/${number}`,
  forks: (id: string) => `/api/notebooks/${enc(id)}/forks`,
  members: (id: string) => `/api/notebooks/${enc(id)}/members`,
  member: (id: string, userId: number) => `/api/notebooks/${enc(id)}/members/${userId}`,
  users: (q: string) => `/api/users${query({ q })}`,
  adminUsers: () => '/api/admin/users',
  adminUser: (userId: number) => `/api/admin/users/${userId}`,
  adminMail: () => '/api/admin/mail',
  reviews: (id: string) => `/api/notebooks/${enc(id)}/reviews`,
  review: (id: string, reviewId: number) => `/api/notebooks/${enc(id)}/reviews/${reviewId}`,
  reviewDecision: (id: string, reviewId: number) => `/api/notebooks/${enc(id)}/reviews/${reviewId}/decision`,
  pins: (id: string) => `/api/notebooks/${enc(id)}/pins`,
  pinComments: (id: string, pinId: number) => `/api/notebooks/${enc(id)}/pins/${pinId}/comments`,
  pinResolve: (id: string, pinId: number) => `/api/notebooks/${enc(id)}/pins/${pinId}/resolve`,
  pinReopen: (id: string, pinId: number) => `/api/notebooks/${enc(id)}/pins/${pinId}/reopen`,
  activity: (id: string, cursor?: string) => `/api/notebooks/${enc(id)}/activity${query({ cursor, limit: 30 })}`,
  settings: () => '/api/me/settings',
} as const;

export const appPaths = {
  home: () => '/',
  notebooks: () => '/notebooks',
  notebook: (id: string) => `/notebooks/${enc(id)}`,
  cellHistory: (id: string, cellId: number) => `/notebooks/${enc(id)}/cells/${cellId}/history`,
  versions: (id: string) => `/notebooks/${enc(id)}/versions`,
  version: (id: string, number: number) => `/notebooks/${enc(id)}/versions/${number}`,
  review: (id: string, reviewId: number) => `/notebooks/${enc(id)}/reviews/${reviewId}`,
  activity: (id: string) => `/notebooks/${enc(id)}/activity`,
  /** A pin's thread on the notebook page (the address the pin e-mails link to). */
  pin: (id: string, pinId: number) => `/notebooks/${enc(id)}#pin-${pinId}`,
  settings: () => '/settings',
  admin: () => '/admin',
  help: () => '/help',
  /** The server's sign-in; it comes back to `returnTo` (a path of this site). */
  signIn: (returnTo?: string) => `/auth/github${query({ returnTo })}`,
} as const;
