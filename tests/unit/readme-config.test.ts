import fs from 'node:fs';
import path from 'node:path';
import { describeConfig, loadConfig, ConfigError } from '../../server/config';
import { shouldSeedDemo } from '../../server/boot';

describe('configuration', () => {
  it('the README table lists every key with its real default', () => {
    const readme = fs.readFileSync(path.join(__dirname, '..', '..', 'README.md'), 'utf8');
    const block = readme.split('<!-- config-table:start -->')[1]!.split('<!-- config-table:end -->')[0]!;
    const rows = describeConfig().map(
      (r) => `| \`${r.key}\` | ${r.default === '(unset)' ? '(unset)' : `\`${r.default}\``} | ${r.doc} |`,
    );
    for (const row of rows) expect(block).toContain(row);
    expect(block.trim().split('\n').length).toBe(rows.length + 2);
  });

  it('names every bad key', () => {
    expect(() => loadConfig({ PORT: 'eighty', LOGIN_RATE_LIMIT: '0' })).toThrow(ConfigError);
    try {
      loadConfig({ PORT: 'eighty', LOGIN_RATE_LIMIT: '0' });
    } catch (e) {
      expect(String((e as Error).message)).toMatch(/PORT/);
      expect(String((e as Error).message)).toMatch(/LOGIN_RATE_LIMIT/);
    }
  });

  it('applies the defaults', () => {
    const c = loadConfig({});
    expect(c.PORT).toBe(8080);
    expect(c.DB_PORT).toBe(3407);
    expect(c.SEED_DEMO).toBe(true);
  });

  it('never seeds the demo in production, even when SEED_DEMO is true', () => {
    expect(shouldSeedDemo(loadConfig({ NODE_ENV: 'production', SEED_DEMO: 'true' }))).toBe(false);
    expect(shouldSeedDemo(loadConfig({ NODE_ENV: 'development' }))).toBe(true);
    expect(shouldSeedDemo(loadConfig({ SEED_DEMO: 'false' }))).toBe(false);
  });
});
