// Tickmark: Insert Timing Block — a circuit from a quick pick, then its template as a snippet at the cursor:
// a fence in a note, a `/* @timing */` comment in C and C++.
import * as vscode from 'vscode';
import { blockTemplate, circuitChoices, type TemplateLine } from './engine';

/** `circuitId` skips the quick pick (for key bindings and tests). True when a block was inserted. */
export async function insertBlock(circuitId?: unknown): Promise<boolean> {
  const editor = vscode.window.activeTextEditor;
  if (!editor) {
    void vscode.window.showInformationMessage('Open a Markdown note or a C/C++ file to insert a timing block.');
    return false;
  }
  const host = hostOf(editor.document.languageId);
  if (!host) {
    void vscode.window.showInformationMessage('Timing blocks go in Markdown notes and C/C++ comments.');
    return false;
  }
  const id = typeof circuitId === 'string' ? circuitId : await pickCircuit();
  const lines = id ? blockTemplate(id) : undefined;
  if (!lines) return false;
  return editor.insertSnippet(templateSnippet(lines, host));
}

function hostOf(languageId: string): 'markdown' | 'c' | undefined {
  if (languageId === 'markdown') return 'markdown';
  return languageId === 'c' || languageId === 'cpp' ? 'c' : undefined;
}

async function pickCircuit(): Promise<string | undefined> {
  const items = circuitChoices().map(({ id, title, summary }) => ({ label: id, description: title, detail: summary }));
  const picked = await vscode.window.showQuickPick(items, { title: 'Insert Timing Block', placeHolder: 'Circuit of the new block', matchOnDescription: true, matchOnDetail: true });
  return picked?.label;
}

/** Snippet syntax treats `$ } \` specially; placeholders are our own words but stay escaped anyway. */
function escapePlaceholder(text: string): string {
  return text.replace(/[$}\\]/g, (ch) => `\\${ch}`);
}

export function templateSnippet(lines: readonly TemplateLine[], host: 'markdown' | 'c'): vscode.SnippetString {
  const body: string[] = [];
  let stop = 2;
  for (const line of lines) {
    body.push(line.key === 'circuit' ? `circuit: ${line.placeholder}` : `${line.key}: \${${stop++}:${escapePlaceholder(line.placeholder)}}`);
  }
  const text =
    host === 'markdown'
      ? ['```timing ${1:name}', ...body, '```', '$0'].join('\n')
      : ['/* @timing ${1:name}', ...body.map((line) => ` * ${line}`), ' */', '$0'].join('\n');
  return new vscode.SnippetString(text);
}
