// Standard output and error of the command line. A file or a pipe is written synchronously, byte for byte, so when
// `main` returns every report is where its reader can read it and the process may end at once, without Node's
// stream machinery (a pipe's stream costs its setup at start and its teardown at exit). A terminal keeps Node's
// stream, which knows the console's encoding on every platform.
import * as fs from 'node:fs';

/**
 * Whether the descriptor is a terminal. A terminal is a character device, so a pipe or a file is answered by one
 * fstat, without loading node:tty (which loads node:net and Node's streams, ~30 modules compiled at start).
 */
export function isTerminal(fd: number): boolean {
  try {
    if (!fs.fstatSync(fd).isCharacterDevice()) return false;
  } catch {
    return false;
  }
  return (require('node:tty') as typeof import('node:tty')).isatty(fd);
}

/**
 * UTF-16 code units encoded per write. A report is written a piece at a time through one scratch buffer (three bytes
 * at most per unit), not encoded whole into a new buffer: a megabyte report would touch a megabyte of fresh pages.
 */
const PIECE = 16384;
let scratch: Buffer | undefined;

const isHighSurrogate = (unit: number): boolean => unit >= 0xd800 && unit <= 0xdbff;

export class ProcessOutput {
  /** The reader closed the pipe (`tickmark check --json | head`): later output goes nowhere, quietly. */
  private closed = false;
  /** Some output waits in Node's stream (a terminal, or a pipe that would block): the process ends when it drains. */
  private queued = false;

  /** Asked of the descriptor once, not at every write. */
  readonly terminal: boolean;

  constructor(private readonly fd: 1 | 2) {
    this.terminal = isTerminal(fd);
  }

  write(text: string): void {
    if (this.closed) return;
    if (this.queued || this.terminal) return this.queue(text);
    const buffer = (scratch ??= Buffer.allocUnsafeSlow(PIECE * 3));
    for (let from = 0; from < text.length;) {
      let to = Math.min(text.length, from + PIECE);
      // A piece never ends between the halves of a surrogate pair: each half alone would be written as U+FFFD.
      if (to < text.length && isHighSurrogate(text.charCodeAt(to - 1))) to--;
      const length = buffer.write(text.slice(from, to), 0, 'utf8');
      let at = 0;
      while (at < length) {
        try {
          at += fs.writeSync(this.fd, buffer, at, length - at);
        } catch (cause) {
          const code = (cause as NodeJS.ErrnoException).code;
          if (code === 'EPIPE') {
            this.closed = true;
            return;
          }
          // A descriptor another process made non-blocking, and full: the rest goes through the stream, in order
          // (the scratch buffer is written over by the next piece, so its bytes are copied).
          if (code === 'EAGAIN') {
            this.queue(Buffer.from(buffer.subarray(at, length)));
            if (to < text.length) this.queue(text.slice(to));
            return;
          }
          throw cause;
        }
      }
      from = to;
    }
  }

  /** Everything written has reached the file, pipe or terminal (or its reader has gone). */
  get flushed(): boolean {
    return !this.queued;
  }

  private queue(data: string | Uint8Array): void {
    const stream = this.fd === 1 ? process.stdout : process.stderr;
    if (!this.queued) {
      this.queued = true;
      stream.on('error', (cause: NodeJS.ErrnoException) => {
        if (cause.code !== 'EPIPE') throw cause;
        this.closed = true;
      });
    }
    stream.write(data);
  }
}
