import { describe, expect, it } from 'vitest';
import { databaseTarget } from './support/database-target.ts';

// The rules of docs/testing.md, case by case (hand-written).
describe('the test database TEST_DATABASE chooses', () => {
  const url = 'postgres://postgres@127.0.0.1:5432/postgres';

  it('defaults to the server in DATABASE_URL when one is set, else to the embedded engine', () => {
    expect(databaseTarget({ DATABASE_URL: url })).toEqual({ kind: 'url', url });
    expect(databaseTarget({})).toEqual({ kind: 'embedded' });
    expect(databaseTarget({ DATABASE_URL: '' })).toEqual({ kind: 'embedded' });
  });

  it('takes the setting over the default, whatever the machine has', () => {
    expect(databaseTarget({ TEST_DATABASE: 'embedded', DATABASE_URL: url })).toEqual({ kind: 'embedded' });
    expect(databaseTarget({ TEST_DATABASE: 'container', DOCKER_HOST: '' })).toEqual({ kind: 'container' });
    expect(databaseTarget({ DOCKER_HOST: 'unix:///var/run/docker.sock' })).toEqual({ kind: 'embedded' });
    expect(databaseTarget({ TEST_DATABASE: 'url', DATABASE_URL: url })).toEqual({ kind: 'url', url });
  });

  it('refuses a setting it does not know, and url without DATABASE_URL, naming the setting', () => {
    expect(() => databaseTarget({ TEST_DATABASE: 'docker' })).toThrow(/^TEST_DATABASE: one of embedded, url, container \(got "docker"\)$/);
    expect(() => databaseTarget({ TEST_DATABASE: 'url' })).toThrow(/^TEST_DATABASE=url needs DATABASE_URL/);
  });
});
