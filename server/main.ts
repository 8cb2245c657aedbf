// `tickmark lsp --stdio`: the analysis over the Language Server Protocol, for any editor. One process serves
// one client; documents are analysed per version (server/store.ts), settings arrive as `tickmark.*`.
import * as path from 'node:path';
import {
  CancellationToken, CodeLensRefreshRequest, DidChangeConfigurationNotification, DidChangeWatchedFilesNotification, ProposedFeatures, TextDocuments,
  TextDocumentSyncKind, createConnection, type CompletionItem, type Connection, type InitializeParams, type InitializeResult,
  type Location, type ServerCapabilities, type TextDocumentPositionParams, type WorkspaceFolder,
} from 'vscode-languageserver/node';
import { TextDocument } from 'vscode-languageserver-textdocument';
import type { At, ClientOptions, Contributors, Feature, ServerContext } from './context';
import { features as builtIn } from './features';
import { corePathOf, FileReader, folderOf, isUriString } from './files';
import { cancelled } from './requests';
import { defaultSettings, parseSettings, type ServerSettings } from './settings';
import { AnalysisStore } from './store';

export const serverName = 'tickmark';
const version = '0.1.0';

/** Starts a server on a connection (stdio when none is given) and returns its context, for tests. */
export function startServer(connection: Connection = createConnection(ProposedFeatures.all), features: Feature[] = builtIn): ServerContext {
  const documents = new TextDocuments(TextDocument);
  const reader = new FileReader({ get: (uri) => documents.get(uri), all: () => documents.all() });
  let settings: ServerSettings = defaultSettings;
  /** Each workspace folder's settings, when the client answers workspace/configuration per folder. */
  let folderSettings = new Map<string, ServerSettings>();
  let initialSettings: ServerSettings = defaultSettings;
  let folders: string[] = [];
  let canPullConfiguration = false;
  let canWatchFiles = false;
  let canRefreshLenses = false;
  const client: ClientOptions = {};

  const log = (message: string) => connection.console.error(message);
  const settingsFor = (file?: string): ServerSettings => {
    if (file === undefined || folderSettings.size === 0) return settings;
    const folder = folderOf(file, folders);
    return (folder !== undefined && folderSettings.get(folder)) || settings;
  };
  const store = new AnalysisStore({
    documents: { get: (uri) => documents.get(uri), all: () => documents.all() },
    reader,
    settings: settingsFor,
    roots: () => folders,
    publish: (uri, docVersion, diagnostics) => void connection.sendDiagnostics({ uri, version: docVersion, diagnostics }),
    log,
  });
  const ctx: ServerContext = {
    connection, documents, store, reader, settings: settingsFor, roots: () => folders, client, log,
    refreshSettings: () => (canPullConfiguration ? pullSettings() : Promise.resolve()),
  };

  const contributors: Contributors = { definition: [], references: [], completion: [], prepareRename: [], rename: [] };
  for (const feature of features) feature.contribute?.(contributors);

  connection.onInitialize((params: InitializeParams): InitializeResult => {
    folders = foldersOf(params);
    const options = (params.initializationOptions ?? {}) as { tickmark?: unknown; retriggerCommand?: unknown };
    initialSettings = settings = parseSettings(options.tickmark);
    if (typeof options.retriggerCommand === 'string') client.retriggerCommand = options.retriggerCommand;
    canPullConfiguration = params.capabilities.workspace?.configuration === true;
    canWatchFiles = params.capabilities.workspace?.didChangeWatchedFiles?.dynamicRegistration === true;
    canRefreshLenses = params.capabilities.workspace?.codeLens?.refreshSupport === true;
    const capabilities: ServerCapabilities = {
      textDocumentSync: { openClose: true, change: TextDocumentSyncKind.Incremental, save: { includeText: false } },
      workspace: { workspaceFolders: { supported: true, changeNotifications: true } },
    };
    for (const feature of features) Object.assign(capabilities, feature.capabilities);
    if (contributors.references.length) capabilities.referencesProvider = true;
    if (contributors.rename.length) capabilities.renameProvider = contributors.prepareRename.length ? { prepareProvider: true } : true;
    return { capabilities, serverInfo: { name: serverName, version } };
  });

  connection.onInitialized(() => {
    if (canPullConfiguration) {
      void connection.client.register(DidChangeConfigurationNotification.type, { section: 'tickmark' }).catch(() => undefined);
      void pullSettings();
    }
    if (canWatchFiles) {
      void connection.client.register(DidChangeWatchedFilesNotification.type, {
        watchers: [{ globPattern: '**/*.{h,hh,hpp,hxx,inc,c,cc,cpp,cxx,md,markdown}' }, { globPattern: '**/compile_commands.json' }],
      }).catch(() => undefined);
    }
    connection.workspace.onDidChangeWorkspaceFolders((e) => {
      const removed = new Set(e.removed.map(folderPath));
      folders = [...folders.filter((f) => !removed.has(f)), ...e.added.map(folderPath)];
      store.invalidate();
      // A new folder's settings: the pull re-analyses again only if they differ.
      if (canPullConfiguration) void pullSettings();
    });
  });

  /**
   * workspace/configuration for `tickmark`, once per workspace folder (each over the initializationOptions); documents
   * re-analysed when anything differs. The first folder's settings also serve files outside every folder.
   */
  let pulls = 0;
  const pullSettings = async (): Promise<void> => {
    const before = JSON.stringify([settings, [...folderSettings]]);
    const pull = ++pulls;
    try {
      const asked = folders.length ? [...folders] : [undefined];
      const sections = await connection.workspace.getConfiguration(asked.map((folder) => ({ section: 'tickmark', scopeUri: folder === undefined ? undefined : reader.uriOf(folder) })));
      // A later pull (the settings or the folders changed meanwhile) has the newer answer.
      if (pull !== pulls) return;
      const parsed = asked.map((_, i) => parseSettings(sections[i], initialSettings));
      settings = parsed[0];
      folderSettings = new Map();
      asked.forEach((folder, i) => { if (folder !== undefined) folderSettings.set(folder, parsed[i]); });
    } catch (cause) {
      log(`reading the tickmark settings failed: ${String(cause)}`);
    }
    if (JSON.stringify([settings, [...folderSettings]]) !== before) settingsChanged();
  };

  const settingsChanged = (): void => {
    store.invalidate();
    if (canRefreshLenses) void connection.sendRequest(CodeLensRefreshRequest.type).catch(() => undefined);
  };

  connection.onDidChangeConfiguration((change) => {
    if (canPullConfiguration) return void pullSettings();
    // A client that pushes its settings: `{ tickmark: { … } }`.
    const pushed = (change.settings as { tickmark?: unknown } | undefined)?.tickmark;
    if (pushed === undefined) return;
    settings = parseSettings(pushed, initialSettings);
    folderSettings = new Map();
    settingsChanged();
  });

  connection.onDidChangeWatchedFiles(({ changes }) => {
    for (const change of changes) {
      const file = corePathOf(change.uri);
      reader.forget(file);
      if (path.basename(file) === 'compile_commands.json') store.invalidate();
      else store.refreshDependants(file);
    }
  });

  documents.onDidOpen((e) => {
    reader.opened(e.document);
    store.opened(e.document);
    // Another document may have read this file from disk; the buffer now counts.
    store.refreshDependants(corePathOf(e.document.uri));
  });
  documents.onDidChangeContent((e) => store.changed(e.document));
  documents.onDidClose((e) => {
    reader.closed(e.document.uri);
    store.closed(e.document.uri);
    // Its unsaved text no longer counts for the files that read it.
    store.refreshDependants(corePathOf(e.document.uri));
    void connection.sendDiagnostics({ uri: e.document.uri, diagnostics: [] });
  });
  documents.onDidSave((e) => store.refreshDependants(corePathOf(e.document.uri)));

  const at = (params: TextDocumentPositionParams, token: CancellationToken): At | undefined => {
    const doc = documents.get(params.textDocument.uri);
    return doc ? { uri: doc.uri, doc, offset: doc.offsetAt(params.position), position: params.position, token } : undefined;
  };
  const merged = <T>(list: Array<(place: At) => T[] | undefined>, place: At | undefined): T[] => (place ? list.flatMap((f) => f(place) ?? []) : []);

  connection.onCompletion((params, token) => {
    if (token.isCancellationRequested) return cancelled();
    return merged<CompletionItem>(contributors.completion.map((f) => (p: At) => f(ctx, p)), at(params, token));
  });
  connection.onDefinition((params, token) => {
    if (token.isCancellationRequested) return cancelled();
    return merged<Location>(contributors.definition.map((f) => (p: At) => f(ctx, p)), at(params, token));
  });
  connection.onReferences((params, token) => {
    if (token.isCancellationRequested) return cancelled();
    return merged<Location>(contributors.references.map((f) => (p: At) => f(ctx, p, params.context.includeDeclaration)), at(params, token));
  });
  connection.onPrepareRename((params, token) => {
    if (token.isCancellationRequested) return cancelled();
    const place = at(params, token);
    for (const f of place ? contributors.prepareRename : []) {
      const found = f(ctx, place!);
      if (found) return found;
    }
    return null;
  });
  connection.onRenameRequest((params, token) => {
    if (token.isCancellationRequested) return cancelled();
    const place = at(params, token);
    for (const f of place ? contributors.rename : []) {
      const found = f(ctx, place!, params.newName);
      if (found) return found;
    }
    return null;
  });

  for (const feature of features) feature.register?.(ctx);
  documents.listen(connection);
  connection.listen();
  return ctx;
}

function folderPath(folder: WorkspaceFolder): string {
  return corePathOf(folder.uri);
}

function foldersOf(params: InitializeParams): string[] {
  if (params.workspaceFolders?.length) return params.workspaceFolders.map(folderPath);
  if (params.rootUri) return [corePathOf(params.rootUri)];
  if (params.rootPath) return [isUriString(params.rootPath) ? corePathOf(params.rootPath) : path.resolve(params.rootPath)];
  return [];
}

if (require.main === module) startServer();
