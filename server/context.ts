// What every feature of the server gets, and the hook points where a feature adds to a request that several
// features answer (definition, references, completion, rename). A feature is one file in server/features/
// exporting a `Feature`; server/features/index.ts lists them. Contributions are merged in list order.
import type {
  CancellationToken, CompletionItem, Connection, Location, Position, PrepareRenameResult, ServerCapabilities, TextDocuments, WorkspaceEdit,
} from 'vscode-languageserver';
import type { TextDocument } from 'vscode-languageserver-textdocument';
import type { FileReader } from './files';
import type { ServerSettings } from './settings';
import type { AnalysisStore } from './store';

export interface ServerContext {
  connection: Connection;
  documents: TextDocuments<TextDocument>;
  store: AnalysisStore;
  reader: FileReader;
  /**
   * The settings for a file: its workspace folder's, as the client answers workspace/configuration for that folder
   * (a multi-root workspace may set `tickmark.c.defines` per folder). Without a file, the first folder's.
   */
  settings(file?: string): ServerSettings;
  /** Workspace folders as absolute paths. */
  roots(): string[];
  /** Reads the settings from the client again (workspace/configuration) before an answer that depends on them. */
  refreshSettings(): Promise<void>;
  /** What the client said it can do, from initializationOptions (beside the `tickmark` settings). */
  client: ClientOptions;
  log(message: string): void;
}

export interface ClientOptions {
  /** A client command that reopens completion after a key is chosen (VS Code: editor.action.triggerSuggest). */
  retriggerCommand?: string;
}

/** Where a request stands: the document, its text, and the offset of the position. */
export interface At {
  uri: string;
  doc: TextDocument;
  offset: number;
  position: Position;
  token: CancellationToken;
}

/** Hook points: each contributor answers for the place it knows, or nothing. */
export interface Contributors {
  definition: Array<(ctx: ServerContext, at: At) => Location[] | undefined>;
  references: Array<(ctx: ServerContext, at: At, includeDeclaration: boolean) => Location[] | undefined>;
  completion: Array<(ctx: ServerContext, at: At) => CompletionItem[] | undefined>;
  /** The range to rename and its current text, for the first contributor that knows the place. */
  prepareRename: Array<(ctx: ServerContext, at: At) => PrepareRenameResult | undefined>;
  rename: Array<(ctx: ServerContext, at: At, newName: string) => WorkspaceEdit | undefined>;
}

export interface Feature {
  name: string;
  /** Capabilities this feature adds to the initialize answer. */
  capabilities?: Partial<ServerCapabilities>;
  /** Request and notification handlers of its own. */
  register?(ctx: ServerContext): void;
  /** Contributions to the shared requests. */
  contribute?(into: Contributors): void;
}
