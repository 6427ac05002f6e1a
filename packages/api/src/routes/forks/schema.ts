export { ForkCreateSchema } from '../../contract/forks.js';
