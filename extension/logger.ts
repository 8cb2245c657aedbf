// The Output channel "Tickmark": what the extension did and what went wrong, for bug reports.
import * as vscode from 'vscode';

export interface Logger {
  info(message: string): void;
  warn(message: string): void;
  error(message: string, cause?: unknown): void;
}

export function createLogger(): Logger & vscode.Disposable & { readonly channel: vscode.LogOutputChannel } {
  const channel = vscode.window.createOutputChannel('Tickmark', { log: true });
  return {
    channel,
    info: (message) => channel.info(message),
    warn: (message) => channel.warn(message),
    error: (message, cause) => channel.error(cause === undefined ? message : `${message}: ${describeCause(cause)}`),
    dispose: () => channel.dispose(),
  };
}

function describeCause(cause: unknown): string {
  return cause instanceof Error ? (cause.stack ?? cause.message) : String(cause);
}
