import nextVitals from 'eslint-config-next/core-web-vitals';
import nextTs from 'eslint-config-next/typescript';

const config = [
  ...nextVitals,
  ...nextTs,
  {
    ignores: ['.next/**', 'node_modules/**', '.data/**', '.test-data/**', 'test-artifacts/**', 'next-env.d.ts'],
  },
  {
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
    },
  },
  {
    // The pure engine must not reach into the database, the framework or React.
    files: ['lib/evidence/**'],
    rules: {
      'no-restricted-imports': [
        'error',
        { patterns: ['@/db*', '@/lib/services*', '@/lib/queries*', 'next', 'next/*', 'react', 'react-dom', 'sequelize', 'mariadb', 'node:*', 'fs', 'path'] },
      ],
    },
  },
];

export default config;
