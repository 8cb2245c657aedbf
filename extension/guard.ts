// Providers and event handlers run inside the editor: a fault in one block must not surface as an editor
// error or a stuck request. It goes to the Tickmark Output channel and the feature answers empty.
import type { Logger } from './logger';

/** `fn` with every throw logged as "`what` failed" and answered with `fallback`. */
export function guarded<A extends unknown[], R>(logger: Logger, what: string | ((...args: A) => string), fn: (...args: A) => R, fallback: R): (...args: A) => R {
  return (...args: A): R => {
    try {
      return fn(...args);
    } catch (cause) {
      logger.error(`${typeof what === 'string' ? what : what(...args)} failed`, cause);
      return fallback;
    }
  };
}
