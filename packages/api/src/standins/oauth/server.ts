/** `node dist/standins/oauth/server.js`: the OAuth stand-in as its own process (npm start, npm test). */
import { OAUTH_CALLBACK_PATH } from '../../config.js';
import { createOAuthStandin } from './standin.js';

const port = Number(process.env.OAUTH_STANDIN_PORT ?? 4411);
const publicUrl = process.env.PUBLIC_URL?.replace(/\/+$/, '');
const clients = [
  {
    id: process.env.OAUTH_CLIENT_ID ?? 'rolloff-local',
    secret: process.env.OAUTH_CLIENT_SECRET ?? 'rolloff-local-secret',
    callbackUrl: publicUrl ? `${publicUrl}${OAUTH_CALLBACK_PATH}` : undefined,
  },
];

try {
  const standin = await createOAuthStandin({ port, clients });
  console.log(`sign-in stand-in on ${standin.url}`);
  const stop = () => void standin.close().then(() => process.exit(0));
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
} catch (error) {
  const code = (error as NodeJS.ErrnoException).code;
  console.error(code === 'EADDRINUSE' ? `Port ${port} is already in use (set OAUTH_STANDIN_PORT).` : error);
  process.exit(1);
}
