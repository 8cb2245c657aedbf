// One table of file types: the scanner, the CLI's folder walk and a note's `firmware:` path agree on it.
import { strict as assert } from 'assert';
import { hostOfPath } from '../../core/scan';
import { isTimingHost } from '../../core/cli/files';
import { isFirmwarePath } from '../../core/analyze/keys';

describe('file types', () => {
  // gcc manual, "Options Controlling the Kind of Output": .cc .cp .cxx .cpp .c++ .C are C++ sources, .hh .hpp headers.
  const cFamily = ['main.c', 'board.h', 'tick.cc', 'tick.cpp', 'tick.cxx', 'tick.hpp', 'tick.hh'];
  it('reads every C-family file the scanner reads, .cxx included, in the CLI and as a firmware: path', () => {
    for (const file of cFamily) {
      assert.equal(hostOfPath(`src/${file}`), 'c', file);
      assert.equal(isTimingHost(`src/${file}`), true, file);
      assert.equal(isFirmwarePath(`../firmware/${file}`), true, file);
    }
  });
  it('reads Markdown notes and nothing else', () => {
    // CommonMark names no extension; .md and .markdown are the usual ones (common practice).
    assert.equal(hostOfPath('notes/clock.md'), 'markdown');
    assert.equal(isTimingHost('notes/clock.markdown'), true);
    for (const other of ['build.mk', 'notes.txt', 'image.png', 'Makefile']) assert.equal(isTimingHost(other), false, other);
  });
});
