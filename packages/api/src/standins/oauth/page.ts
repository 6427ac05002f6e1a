/** The stand-in's authorize page: pick a demo identity, or type a new login and e-mail. */
import { escapeHtml } from '../../html.js';
import type { Identity } from './identities.js';

export interface AuthorizeRequest {
  clientId: string;
  redirectUri: string;
  state: string;
  scope: string;
}

function hidden(request: AuthorizeRequest): string {
  return [
    ['client_id', request.clientId],
    ['redirect_uri', request.redirectUri],
    ['state', request.state],
    ['scope', request.scope],
  ]
    .map(([name, value]) => `<input type="hidden" name="${name}" value="${escapeHtml(value!)}">`)
    .join('');
}

export function authorizePage(request: AuthorizeRequest, identities: Identity[], problem: string | null = null): string {
  const people = identities
    .map(
      (identity) => `<li><form method="post" action="/login/oauth/authorize">${hidden(request)}
        <input type="hidden" name="login" value="${escapeHtml(identity.login)}">
        <button type="submit"><strong>${escapeHtml(identity.name)}</strong> <span>${escapeHtml(identity.login)} · ${escapeHtml(identity.email)}</span></button>
      </form></li>`,
    )
    .join('\n');
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>Sign in (local stand-in)</title>
<style>
  body { font-family: system-ui, sans-serif; max-width: 34rem; margin: 3rem auto; padding: 0 1rem; color: #1f2933; line-height: 1.45 }
  ul { list-style: none; padding: 0 } li { margin: .4rem 0 }
  button { width: 100%; text-align: left; padding: .6rem .8rem; border: 1px solid #c5ccd3; border-radius: .4rem; background: #fff; cursor: pointer; font: inherit }
  button:hover, button:focus { border-color: #1c5fa8; outline: none } button span { color: #52606d; font-size: .9em }
  label { display: block; margin: .5rem 0 .2rem } input[type=text], input[type=email] { width: 100%; padding: .5rem; font: inherit; box-sizing: border-box }
  .note { color: #52606d; font-size: .9em } .problem { color: #a61b1b }
</style></head><body>
<h1>Sign in</h1>
<p class="note">This is the local stand-in for GitHub sign-in, for development and tests. Nothing leaves this machine.</p>
${problem ? `<p class="problem" role="alert">${escapeHtml(problem)}</p>` : ''}
<h2>Continue as</h2>
<ul>${people}</ul>
<h2>Someone new</h2>
<form method="post" action="/login/oauth/authorize">${hidden(request)}
  <label for="login">Login</label><input id="login" name="login" type="text" required autocomplete="off">
  <label for="name">Name</label><input id="name" name="name" type="text" autocomplete="off">
  <label for="email">E-mail</label><input id="email" name="email" type="email" autocomplete="off">
  <p><button type="submit">Sign in as this person</button></p>
</form>
<form method="post" action="/login/oauth/authorize">${hidden(request)}<input type="hidden" name="deny" value="1">
  <p><button type="submit">Cancel</button></p>
</form>
</body></html>`;
}
