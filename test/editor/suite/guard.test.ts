// The wrapper every provider goes through: a throw is logged with its cause and answered with the fallback.
import { strict as assert } from 'assert';
import { describe, it } from 'mocha';
import { guarded } from '../../../extension/guard';
import type { Logger } from '../../../extension/logger';

function recordingLogger(): Logger & { errors: Array<[string, unknown]> } {
  const errors: Array<[string, unknown]> = [];
  return { errors, info: () => {}, warn: () => {}, error: (message, cause) => void errors.push([message, cause]) };
}

export function guardTests(): void {
  describe('guarded providers', () => {
    it('logs a throw with what failed and its cause, and answers the fallback', () => {
      const logger = recordingLogger();
      const fault = new Error('model blew up');
      const provide = guarded(logger, (name: string) => `hover in ${name}`, (name: string): string[] => {
        if (name === 'bad.md') throw fault;
        return [name];
      }, []);
      assert.deepEqual(provide('good.md'), ['good.md']);
      assert.deepEqual(logger.errors, []);
      assert.deepEqual(provide('bad.md'), []);
      assert.deepEqual(logger.errors, [['hover in bad.md failed', fault]]);
    });
  });
}
