/** Every API path the web calls, in one table. */
export const apiPaths = {
  health: () => '/api/health',
} as const;
