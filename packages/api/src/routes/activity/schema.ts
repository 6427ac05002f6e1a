export { PageQuerySchema as ActivityQuerySchema } from '../../contract/common.js';
