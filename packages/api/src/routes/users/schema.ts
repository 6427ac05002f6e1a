export { UserSearchQuerySchema } from '../../contract/users.js';
