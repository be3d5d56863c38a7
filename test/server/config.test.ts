// Configuration: defaults, environment variables checked with zod, clear
// messages for bad values, and the server exiting with code 1 on them.
import { spawnSync } from 'node:child_process';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { ConfigError, loadConfig } from '../../server/config';

describe('loadConfig', () => {
  it('runs with no configuration at all: port 3000, every interface, ./data/chargewalk.db, demo on, FULL sync', () => {
    const c = loadConfig({}, []);
    expect(c).toEqual({
      port: 3000, host: '0.0.0.0', dbPathGiven: './data/chargewalk.db', dbPath: resolve('data/chargewalk.db'), demo: true,
      clientDir: resolve('dist/client'), synchronous: 'full', bodyLimit: '1mb', check: 'quick',
    });
  });

  it('reads every variable', () => {
    const c = loadConfig({
      PORT: '8080', HOST: '127.0.0.1', CHARGEWALK_DB: '/srv/cw/plant.db', CHARGEWALK_DEMO: 'false', CHARGEWALK_CLIENT_DIR: '/srv/cw/client',
      CHARGEWALK_SYNC: 'normal', CHARGEWALK_BODY_LIMIT: '2MB', CHARGEWALK_INTEGRITY_CHECK: '1',
    }, []);
    expect(c).toEqual({
      port: 8080, host: '127.0.0.1', dbPathGiven: '/srv/cw/plant.db', dbPath: '/srv/cw/plant.db', demo: false, clientDir: '/srv/cw/client',
      synchronous: 'normal', bodyLimit: '2mb', check: 'full',
    });
    expect(loadConfig({ CHARGEWALK_DEMO: '0' }, []).demo).toBe(false);
    expect(loadConfig({ CHARGEWALK_DEMO: 'true' }, []).demo).toBe(true);
    expect(loadConfig({ PORT: '' }, []).port).toBe(3000); // empty counts as unset
    expect(loadConfig({}, ['--check']).check).toBe('full');
  });

  it('refuses bad values, naming each variable', () => {
    const bad = (env: NodeJS.ProcessEnv, re: RegExp) => {
      expect(() => loadConfig(env, [])).toThrowError(ConfigError);
      expect(() => loadConfig(env, [])).toThrowError(re);
    };
    bad({ PORT: 'abc' }, /PORT="abc": PORT must be a whole number from 0 to 65535/);
    bad({ PORT: '70000' }, /PORT="70000"/);
    bad({ CHARGEWALK_DB: ':memory:' }, /CHARGEWALK_DB=":memory:": .*lose every reading/);
    bad({ CHARGEWALK_DEMO: 'yes' }, /CHARGEWALK_DEMO must be 1, 0, true or false/);
    bad({ CHARGEWALK_SYNC: 'off' }, /CHARGEWALK_SYNC must be full or normal/);
    bad({ CHARGEWALK_BODY_LIMIT: 'lots' }, /CHARGEWALK_BODY_LIMIT must be a size/);
    bad({ PORT: 'x', CHARGEWALK_SYNC: 'off' }, /PORT=.*\n.*CHARGEWALK_SYNC=/);
    expect(() => loadConfig({}, ['--verbose'])).toThrowError(/unknown argument --verbose/);
  });

  it('under test without CHARGEWALK_DB uses its own temporary data folder', () => {
    const c = loadConfig({ VITEST: 'true' }, []);
    expect(c.dbPath).not.toBe(resolve('data/chargewalk.db'));
    expect(c.dbPath).toMatch(/chargewalk-test-.*chargewalk\.db$/);
  });

  it('the server exits with code 1 and a clear message on a bad variable', () => {
    const r = spawnSync(process.execPath, ['--import', 'tsx', 'server/main.ts'], {
      env: { ...process.env, PORT: 'eighty', CHARGEWALK_DB: '/nonexistent/x.db' }, encoding: 'utf8', timeout: 30_000,
    });
    expect(r.status).toBe(1);
    expect(r.stderr).toContain('chargewalk: the configuration is not valid');
    expect(r.stderr).toContain('PORT="eighty"');
  });
});
