import { defineConfig } from 'drizzle-kit';

export default defineConfig({
  dialect: 'postgresql',
  schema: './api/db/schema/index.ts',
  out: './drizzle',
  casing: 'snake_case',
});
