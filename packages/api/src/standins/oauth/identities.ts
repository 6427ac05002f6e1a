/** The people the OAuth stand-in knows: the demo team, plus anyone typed in on its page. */
import { createHash } from 'node:crypto';
import { demoUsers } from '../../seed/demo-users.js';

export interface Identity {
  /** GitHub's numeric user id: derived from the login, so it stays the same across restarts. */
  id: number;
  login: string;
  name: string;
  email: string;
}

export const loginPattern = /^[A-Za-z0-9][A-Za-z0-9._-]{0,99}$/;
const emailPattern = /^[^\s@]+@[^\s@]+\.[^\s@]+$/;

/** A stable id in 1..2^31-1, as GitHub ids are positive 32-bit numbers (in practice). */
function idOf(login: string): number {
  return (createHash('sha256').update(login).digest().readUInt32BE(0) % 2_147_483_646) + 1;
}

/** An in-memory directory of identities with stable ids (the demo team first). */
export class IdentityDirectory {
  private readonly byLogin = new Map<string, Identity>();

  constructor() {
    for (const user of demoUsers) this.add(user.login, user.name, user.email);
  }

  list(): Identity[] {
    return [...this.byLogin.values()];
  }

  find(login: string): Identity | undefined {
    return this.byLogin.get(login);
  }

  /** The identity with `login`, created (with the given or an example.com address) if new. */
  findOrAdd(login: string, name = '', email = ''): Identity {
    return this.find(login) ?? this.add(login, name || login, email || `${login}@example.com`);
  }

  private add(login: string, name: string, email: string): Identity {
    const identity = { id: idOf(login), login, name, email };
    this.byLogin.set(login, identity);
    return identity;
  }
}

/** Why a typed-in login or e-mail cannot be used, or null when both are fine. */
export function identityProblem(login: string, email: string): string | null {
  if (!loginPattern.test(login)) return 'A login starts with a letter or digit and has only letters, digits, ".", "_" and "-".';
  if (email && !emailPattern.test(email)) return 'That e-mail address does not look complete (name@example.com).';
  return null;
}
