// The panel's HTML under the rules of STYLE.md "Webview", built with a real webview's cspSource and
// resource URIs: CSP default-src 'none', script only by nonce, styles only from the webview's origin.
import { strict as assert } from 'assert';
import { after, before, describe, it } from 'mocha';
import * as vscode from 'vscode';
import { newNonce, panelHtml } from '../../../extension/panel/html';
import { panelOptions } from '../../../extension/panel/panel';
import { activeExtension } from './host';

/** Directives of the CSP meta tag, by name (CSP Level 3, section 2.2: a policy is `;`-separated). */
function cspOf(html: string): Map<string, string[]> {
  const match = /<meta http-equiv="Content-Security-Policy" content="([^"]*)">/.exec(html);
  assert.ok(match, 'no CSP meta tag');
  const directives = new Map<string, string[]>();
  for (const part of match[1].replace(/&#39;|&apos;/g, "'").split(';')) {
    const [name, ...sources] = part.trim().split(/\s+/);
    if (name) directives.set(name, sources);
  }
  return directives;
}

export function panelHtmlTests(): void {
  describe('waveform panel HTML', () => {
    let probe: vscode.WebviewPanel;
    let html: string;
    let nonce: string;

    before(async () => {
      const extension = await activeExtension();
      probe = vscode.window.createWebviewPanel('tickmark.test.cspProbe', 'CSP probe', { viewColumn: vscode.ViewColumn.Active, preserveFocus: true }, panelOptions(extension.extensionUri));
      const webview = probe.webview;
      nonce = newNonce();
      html = panelHtml({
        cspSource: webview.cspSource,
        scriptUri: webview.asWebviewUri(vscode.Uri.joinPath(extension.extensionUri, 'media', 'dist', 'panel.js')).toString(),
        styleUri: webview.asWebviewUri(vscode.Uri.joinPath(extension.extensionUri, 'media', 'panel.css')).toString(),
        nonce,
      });
    });
    after(() => probe.dispose());

    it("sets default-src 'none' and lets scripts run only with the page's nonce", () => {
      const csp = cspOf(html);
      assert.deepEqual(csp.get('default-src'), ["'none'"]);
      assert.deepEqual(csp.get('script-src'), [`'nonce-${nonce}'`]);
      assert.deepEqual(csp.get('style-src'), probe.webview.cspSource.split(/\s+/));
      for (const sources of csp.values()) {
        for (const bad of ["'unsafe-inline'", "'unsafe-eval'", '*', 'http:', 'https:', 'data:']) assert.ok(!sources.includes(bad), `CSP allows ${bad}`);
      }
    });

    it('gives every script tag the nonce, and no script a body of its own', () => {
      const scripts = [...html.matchAll(/<script\b([^>]*)>([\s\S]*?)<\/script>/g)];
      assert.equal(scripts.length, 1);
      for (const [, attrs, body] of scripts) {
        assert.match(attrs, new RegExp(`nonce="${nonce.replace(/[+/=]/g, (c) => '\\' + c)}"`));
        assert.equal(body.trim(), '', 'inline script body');
      }
      assert.doesNotMatch(html, /\son[a-z]+\s*=/i, 'inline event handler attribute');
    });

    it('loads only its own two files from the webview resource origin, nothing remote', () => {
      const urls = [...html.matchAll(/\b(?:src|href)="([^"]*)"/g)].map((m) => m[1]);
      assert.equal(urls.length, 2);
      const origin = new URL(probe.webview.asWebviewUri(vscode.Uri.file('/')).toString()).origin;
      for (const url of urls) assert.equal(new URL(url).origin, origin, url);
      assert.ok(urls.some((u) => u.endsWith('/media/dist/panel.js')));
      assert.ok(urls.some((u) => u.endsWith('/media/panel.css')));
      // No URL other than those two and the CSP's own source appears anywhere in the page.
      const everyUrl = [...html.matchAll(/(?:https?|wss?):\/\/[^\s"';]+/g)].map((m) => m[0]);
      assert.ok(everyUrl.every((u) => urls.includes(u) || probe.webview.cspSource.includes(u)), everyUrl.join(' '));
    });

    it('carries the one idle hint the script shows again after each redraw', () => {
      assert.match(html, /<p id="readout"[^>]*>Move the mouse over the plot to read time and values\.<\/p>/);
    });

    it('draws a fresh 128-bit nonce each time', () => {
      // CSP Level 3, section 7.2: a nonce should be at least 128 bits from a secure random source.
      const nonces = new Set(Array.from({ length: 20 }, newNonce));
      assert.equal(nonces.size, 20);
      for (const n of nonces) assert.equal(Buffer.from(n, 'base64').length, 16);
    });

    it('limits local resources to media/ alone (STYLE.md, Webview)', async () => {
      const extension = await activeExtension();
      const roots = (panelOptions(extension.extensionUri).localResourceRoots ?? []).map((u) => u.path);
      assert.deepEqual(roots, [vscode.Uri.joinPath(extension.extensionUri, 'media').path]);
    });
  });
}
