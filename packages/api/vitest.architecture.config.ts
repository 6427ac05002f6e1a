import { defineConfig } from 'vitest/config';

// `npm run lint`: the import-direction test alone, without the database the other tests need.
export default defineConfig({ test: { include: ['src/architecture.test.ts'] } });
