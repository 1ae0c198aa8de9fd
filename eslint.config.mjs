import nextCoreWebVitals from 'eslint-config-next/core-web-vitals';
import nextTypescript from 'eslint-config-next/typescript';

const config = [
  ...nextCoreWebVitals,
  ...nextTypescript,
  {
    ignores: ['.next/**', '.data/**', 'node_modules/**', 'public/media/**', 'test-results/**', 'playwright-report/**', 'next-env.d.ts'],
  },
  {
    // sequelize-cli loads these with plain require.
    files: ['**/*.cjs'],
    rules: { '@typescript-eslint/no-require-imports': 'off' },
  },
];

export default config;
