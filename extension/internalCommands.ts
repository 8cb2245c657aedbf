// Commands for the editor tests and the bench, not contributed in package.json: they never appear in the
// command palette, but executeCommand reaches them.
import * as vscode from 'vscode';
import { clientLoadMs, type ServerRequests } from './client';
import type { CacheStats } from './engine';
import { engineLoadState } from './engine';

export const internalCommandIds = {
  activationTime: 'tickmark.internal.activationTime',
  cacheStats: 'tickmark.internal.cacheStats',
} as const;

/** What the extension measured of its own activation, in milliseconds of performance.now(). */
export interface ActivationRecord {
  /** From the first module body of out/extension.js running to the end of activate(). */
  activationMs: number;
  /** Running the bundle's module bodies, `require('vscode')` (the host builds its API object then) included. */
  moduleLoadMs: number;
  /** Between the module's end and activate() being called: the host preparing the extension's context. */
  hostWaitMs: number;
  /** Inside activate(). */
  activateMs: number;
  /** Whether the core engine had been loaded by the end of activate() (it should not be). */
  engineLoadedAtActivation: boolean;
  /** Whether it is loaded in the extension host now (the preview and the panel load it), and how long its first load took. */
  engineLoaded: boolean;
  engineLoadMs?: number;
  /** From the end of activate() to the language server's answer to `initialize` (its own process); undefined until then. */
  serverReadyMs?: number;
  /** Loading the language client library on the host's thread, just after activation (out/client.js). */
  clientLoadMs?: number;
}

export interface ActivationMarks {
  moduleLoadStart: number;
  moduleLoadEnd: number;
  activateStart: number;
  activateEnd: number;
  engineLoadedAtActivation: boolean;
  serverReady?: number;
}

export function registerInternalCommands(requests: ServerRequests, marks: () => ActivationMarks | undefined): vscode.Disposable {
  return vscode.Disposable.from(
    vscode.commands.registerCommand(internalCommandIds.activationTime, (): ActivationRecord | undefined => {
      const m = marks();
      if (!m) return undefined;
      const now = engineLoadState();
      return {
        activationMs: m.activateEnd - m.moduleLoadStart,
        moduleLoadMs: m.moduleLoadEnd - m.moduleLoadStart,
        hostWaitMs: m.activateStart - m.moduleLoadEnd,
        activateMs: m.activateEnd - m.activateStart,
        engineLoadedAtActivation: m.engineLoadedAtActivation,
        engineLoaded: now.loaded,
        engineLoadMs: now.loadMs,
        serverReadyMs: m.serverReady === undefined ? undefined : m.serverReady - m.activateEnd,
        clientLoadMs,
      };
    }),
    // The server's analyser of the document: blocks in its last pass and how many were evaluated afresh.
    vscode.commands.registerCommand(internalCommandIds.cacheStats, async (uri: vscode.Uri | string): Promise<CacheStats | undefined> => {
      const stats = await requests.cacheStats(typeof uri === 'string' ? vscode.Uri.parse(uri) : uri);
      return stats ? { blocks: stats.blocks, evaluated: stats.evaluated } : undefined;
    }),
  );
}
