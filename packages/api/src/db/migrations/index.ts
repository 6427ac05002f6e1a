import { CreateUsers1764633600000 } from './1764633600000-create-users.js';
import { CreateAppState1764633600001 } from './1764633600001-create-app-state.js';

/**
 * Every migration, oldest first. Listed by class rather than found by a file glob, so the
 * same DataSource works built, under tsx and under Vitest. Add a new migration here.
 */
export const migrations = [CreateUsers1764633600000, CreateAppState1764633600001];
