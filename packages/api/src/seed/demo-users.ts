/**
 * The demo team: a fictional small instruments company. Logins and e-mail addresses are
 * invented, at example.com.
 */
export const demoUsers = [
  { login: 'mara.lindqvist', name: 'Mara Lindqvist', email: 'mara.lindqvist@example.com', siteRole: 'admin' },
  { login: 'tobias.okafor', name: 'Tobias Okafor', email: 'tobias.okafor@example.com', siteRole: 'member' },
  { login: 'ines.carvalho', name: 'Inês Carvalho', email: 'ines.carvalho@example.com', siteRole: 'member' },
  { login: 'kenji.arai', name: 'Kenji Arai', email: 'kenji.arai@example.com', siteRole: 'member' },
  { login: 'priya.venkat', name: 'Priya Venkat', email: 'priya.venkat@example.com', siteRole: 'member' },
] as const;
