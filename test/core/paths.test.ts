// The core's own path functions against Node's (path.posix, path.win32) and its UTF-8 count against Buffer.
import { strict as assert } from 'assert';
import * as path from 'node:path';
import fc from 'fast-check';
import { basename, dirname, isInside, join, relative, resolve } from '../../core/paths';
import { utf8Bytes } from '../../core/size';

const segment = fc.constantFrom('a', 'b', 'src', '..', '.', 'board.h', 'x y', 'é');
const posixPath = fc.array(segment, { minLength: 1, maxLength: 6 }).map((parts) => '/' + parts.join('/'));
const relativePart = fc.array(segment, { minLength: 1, maxLength: 4 }).map((parts) => parts.join('/'));
const winPath = fc.tuple(fc.constantFrom('C:', 'D:'), fc.array(segment, { minLength: 1, maxLength: 6 })).map(([d, parts]) => d + '\\' + parts.join('\\'));

describe('core paths agree with Node', () => {
  it('POSIX: resolve, dirname, basename, relative, inside', () => {
    fc.assert(fc.property(posixPath, relativePart, posixPath, (a, rel, b) => {
      assert.equal(resolve(a, rel), path.posix.resolve(a, rel));
      assert.equal(resolve(a), path.posix.resolve(a));
      assert.equal(dirname(resolve(a)), path.posix.dirname(path.posix.resolve(a)));
      assert.equal(basename(resolve(a)), path.posix.basename(path.posix.resolve(a)));
      assert.equal(relative(a, b), path.posix.relative(a, b));
      assert.equal(join(a, rel), path.posix.join(a, rel));
      const r = path.posix.relative(path.posix.resolve(b), path.posix.resolve(a));
      assert.equal(isInside(a, b), r === '' || (!r.startsWith('..') && !path.posix.isAbsolute(r)));
    }));
  });

  it('Windows: resolve, dirname, basename, relative', () => {
    fc.assert(fc.property(winPath, relativePart, winPath, (a, rel, b) => {
      const winRel = rel.split('/').join('\\');
      assert.equal(resolve(a, winRel), path.win32.resolve(a, winRel));
      assert.equal(dirname(resolve(a)), path.win32.dirname(path.win32.resolve(a)));
      assert.equal(basename(resolve(a)), path.win32.basename(path.win32.resolve(a)));
      assert.equal(relative(a, b).split('\\').join('/'), path.win32.relative(a, b).split('\\').join('/'));
    }));
  });

  it('counts UTF-8 bytes as Buffer does, lone surrogates as U+FFFD', () => {
    fc.assert(fc.property(fc.string({ unit: 'binary' }), (text) => assert.equal(utf8Bytes(text), Buffer.byteLength(text, 'utf8'))));
    for (const text of ['', 'µ', 'Ω', '€', '😀', '\ud800', 'a\udc00b']) assert.equal(utf8Bytes(text), Buffer.byteLength(text, 'utf8'), JSON.stringify(text));
  });
});
