/** `/api/me/settings`: the signed-in person's own settings (which e-mails they get). */
import { Router } from 'express';
import { actorOf, requireUser } from '../../auth/require-user.js';
import { SettingsUpdateSchema } from '../../contract/settings.js';
import { connect } from '../../db/connection.js';
import { getSettings, updateSettings } from '../../services/settings.js';
import { validate } from '../../validate.js';

export const settingsRouter = Router();
settingsRouter.use(requireUser);

settingsRouter.get('/', async (req, res) => {
  res.json(await getSettings(await connect(), actorOf(req).id));
});

const update = validate({ body: SettingsUpdateSchema });
settingsRouter.patch('/', update, async (req, res) => {
  res.json(await updateSettings(await connect(), actorOf(req).id, update.input(req).body));
});
