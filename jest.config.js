/** Every test of the project, run by `npm test`.
 *  Projects: unit (pure modules), api (supertest + a private MariaDB),
 *  c (generated C compiled with gcc/clang), browser (Debian's Chromium). */
const esmPackages = [
  'archiver', 'zip-stream', 'compress-commons', 'crc32-stream', 'is-stream', 'minimatch',
  'brace-expansion', 'balanced-match', 'd3-.*', 'internmap',
].join('|');
const swc = ['@swc/jest', {
  jsc: { parser: { syntax: 'typescript', tsx: true }, target: 'es2022', transform: { react: { runtime: 'automatic' } } },
  module: { type: 'commonjs' },
}];
const common = {
  testEnvironment: 'node',
  transform: { '^.+\\.(t|j|mj|cj)sx?$': swc },
  transformIgnorePatterns: [`/node_modules/(?!(${esmPackages})/)`],
  moduleFileExtensions: ['ts', 'tsx', 'js', 'mjs', 'cjs', 'json'],
};
// A private MariaDB is started only when a project that needs one runs.
const withDb = {
  globalSetup: '<rootDir>/tests/helpers/global-setup.ts',
  globalTeardown: '<rootDir>/tests/helpers/global-teardown.ts',
};
module.exports = {
  projects: [
    { ...common, displayName: 'unit', testMatch: ['<rootDir>/tests/unit/**/*.test.ts'] },
    { ...common, ...withDb, displayName: 'api', testMatch: ['<rootDir>/tests/api/**/*.test.ts'] },
    { ...common, displayName: 'c', testMatch: ['<rootDir>/tests/c/**/*.test.ts'] },
    { ...common, ...withDb, globalSetup: '<rootDir>/tests/helpers/global-setup-browser.ts', displayName: 'browser', testMatch: ['<rootDir>/tests/browser/**/*.test.ts'] },
  ],
};
