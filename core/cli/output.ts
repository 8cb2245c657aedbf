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
    const bytes = Buffer.from(text, 'utf8');
    let at = 0;
    while (at < bytes.length) {
      try {
        at += fs.writeSync(this.fd, bytes, at);
      } catch (cause) {
        const code = (cause as NodeJS.ErrnoException).code;
        if (code === 'EPIPE') {
          this.closed = true;
          return;
        }
        // A descriptor another process made non-blocking, and full: the rest goes through the stream, in order.
        if (code === 'EAGAIN') return this.queue(bytes.subarray(at));
        throw cause;
      }
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
