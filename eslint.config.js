// Lint: type-checked rules plus the stage layering of STYLE.md §1 — a stage imports only
// from earlier stages and the numerical core.
import tseslint from 'typescript-eslint';

const core = ['numeric', 'data', 'encoders', 'training', 'inference', 'evaluation'];
const stages = ['config', 'plan', 'execute', 'store', 'report', 'cli'];

/** Folders under runner/ that `stage` must not import from. */
function forbiddenFor(stage) {
  const index = stages.indexOf(stage);
  if (index >= 0) return stages.slice(index + 1);
  // The core never reaches into the pipeline stages (plan/ job specs are plain data, allowed).
  return stages.filter((s) => s !== 'config' && s !== 'plan');
}

const layering = [...stages, ...core].map((stage) => ({
  files: [`runner/${stage}/**/*.ts`],
  rules: {
    'no-restricted-imports': [
      'error',
      {
        patterns: forbiddenFor(stage).map((f) => ({
          group: [`**/${f}/*`, `../${f}/*`, `../../${f}/*`],
          message: `runner/${stage} may not import from runner/${f} (stages flow one way, see DEVELOPERS.md).`,
        })),
      },
    ],
  },
}));

export default tseslint.config(
  {
    ignores: [
      'node_modules/**',
      'results/**',
      'native/build/**',
      'test-artifacts/**',
      'coverage/**',
    ],
  },
  ...tseslint.configs.recommendedTypeChecked,
  {
    languageOptions: {
      parserOptions: {
        projectService: { allowDefaultProject: ['*.js', 'bin/*.mjs'] },
        tsconfigRootDir: import.meta.dirname,
      },
    },
    rules: {
      '@typescript-eslint/switch-exhaustiveness-check': 'error',
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_' }],
    },
  },
  {
    files: ['**/*.js', '**/*.mjs'],
    ...tseslint.configs.disableTypeChecked,
  },
  ...layering,
);
