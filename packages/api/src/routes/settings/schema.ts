export { SettingsUpdateSchema } from '../../contract/settings.js';
