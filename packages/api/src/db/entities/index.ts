import { User } from './user.js';

/** Every entity the DataSource knows. */
export const entities = [User];
