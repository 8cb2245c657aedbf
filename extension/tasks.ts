// The task type `tickmark`: `tickmark check` over the workspace folder with the problem matcher `$tickmark`, run
// from the command line bundled with the extension (out/cli.js) on the editor's own Node, so nothing needs
// installing. In tasks.json: `{ "type": "tickmark", "paths": ["notes", "firmware"], "args": ["--exclude", "vendor"] }`.
import * as path from 'node:path';
import * as vscode from 'vscode';

interface CheckTaskDefinition extends vscode.TaskDefinition {
  paths?: string[];
  args?: string[];
}

const strings = (value: unknown): string[] => (Array.isArray(value) ? value.filter((v): v is string => typeof v === 'string') : []);

export function registerTasks(extensionPath: string): vscode.Disposable {
  const cli = path.join(extensionPath, 'out', 'cli.js');
  const taskFor = (definition: CheckTaskDefinition, scope: vscode.WorkspaceFolder | vscode.TaskScope) => {
    const paths = strings(definition.paths);
    const args = ['check', ...strings(definition.args), ...(paths.length ? paths : ['.'])];
    const cwd = typeof scope === 'object' ? scope.uri.fsPath : vscode.workspace.workspaceFolders?.[0]?.uri.fsPath;
    // ELECTRON_RUN_AS_NODE: the desktop editor's executable runs as plain Node; NO_COLOR keeps the lines the
    // problem matcher reads free of colour codes.
    const execution = new vscode.ProcessExecution(process.execPath, [cli, ...args], { cwd, env: { ELECTRON_RUN_AS_NODE: '1', NO_COLOR: '1' } });
    const task = new vscode.Task(definition, scope, 'check', 'tickmark', execution, '$tickmark');
    task.detail = `tickmark ${args.join(' ')}`;
    return task;
  };
  return vscode.tasks.registerTaskProvider('tickmark', {
    provideTasks: () => (vscode.workspace.workspaceFolders ?? []).map((folder) => taskFor({ type: 'tickmark', paths: ['.'] }, folder)),
    resolveTask: (task) => taskFor(task.definition as CheckTaskDefinition, task.scope ?? vscode.TaskScope.Workspace),
  });
}
