import type { Member } from '../contract/members.js';
import { iso } from './common.js';
import type { MemberRow } from '../services/members.js';

export function presentMember(row: MemberRow): Member {
  return { user: { id: row.userId, login: row.login, name: row.name }, role: row.role, addedAt: iso(row.addedAt) };
}
