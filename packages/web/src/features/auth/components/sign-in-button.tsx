import { buttonClass } from '../../../components/ui/button';
import { appPaths } from '../../../lib/paths';

/** "Sign in with GitHub": a plain link, since the server does the sign-in round trip. */
export function SignInButton({ returnTo, size = 'md' }: { returnTo?: string; size?: 'sm' | 'md' }) {
  return (
    <a href={appPaths.signIn(returnTo)} className={`${buttonClass('primary', size)} no-underline`}>
      Sign in with GitHub
    </a>
  );
}
