// Lint enforces the layering in DESIGN.md: who may import what.
import tseslint from 'typescript-eslint';

const nodeBuiltins = ['node:*', 'fs', 'fs/*', 'path', 'os', 'child_process', 'crypto', 'url', 'util', 'stream', 'worker_threads', 'http', 'https', 'net'];

export default tseslint.config(
  { ignores: ['dist/**', 'release/**', 'node_modules/**', 'coverage/**', 'tests/artifacts/**', '**/*.d.ts', 'bench/.prof/**'] },
  ...tseslint.configs.recommended,
  {
    rules: {
      '@typescript-eslint/no-explicit-any': 'error',
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
    },
  },
  {
    // The engine is pure: no UI, no Node, no Electron, no file formats.
    files: ['renderer/engine/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', {
        paths: ['react', 'react-dom', 'electron', 'xlsx', 'papaparse', 'zod'],
        patterns: [
          { group: nodeBuiltins, message: 'renderer/engine must stay pure (no Node).' },
          { group: ['**/ui/**', '**/state/**', '**/main/**', '**/bridge/**'], message: 'renderer/engine must not import upward.' },
        ],
      }],
    },
  },
  {
    // The UI runs in a sandboxed renderer: no Node, no Electron, no main-process code.
    files: ['renderer/**/*.ts', 'renderer/**/*.tsx'],
    ignores: ['renderer/engine/**', 'renderer/vite.config.mts'],
    rules: {
      'no-restricted-imports': ['error', {
        paths: ['electron', 'xlsx'],
        patterns: [
          { group: nodeBuiltins, message: 'The renderer has no Node.' },
          { group: ['**/main/**'], message: 'The renderer reaches the main process only through the DesktopBridge.' },
        ],
      }],
    },
  },
  {
    // Services, IPC table, CLI and harness are plain Node: never Electron, never React.
    files: ['main/**/*.ts'],
    ignores: ['main/shell/**', 'main/preload.ts'],
    rules: {
      'no-restricted-imports': ['error', {
        paths: ['electron', 'react', 'react-dom'],
        patterns: [
          { group: ['**/shell/**', '**/shell'], message: 'Only main/shell may use the shell.' },
          { group: ['**/renderer/ui/**', '**/renderer/state/**'], message: 'main may import only renderer/engine and renderer/bridge.' },
        ],
      }],
    },
  },
  {
    files: ['main/services/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', {
        paths: ['electron', 'react', 'react-dom'],
        patterns: [
          { group: ['**/ipc/**', '**/ipc', '**/shell/**', '**/shell', '**/harness/**', '**/cli'], message: 'Services are the bottom layer: they import nothing above them.' },
          { group: ['**/renderer/ui/**', '**/renderer/state/**'], message: 'main may import only renderer/engine and renderer/bridge.' },
        ],
      }],
    },
  },
);
