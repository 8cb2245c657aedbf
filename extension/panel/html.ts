// The panel's HTML shell. It carries no data: the block arrives by postMessage once the script is ready.
// Its readout text is the panel's one idle hint: media/panel.ts reads it back rather than keeping a copy.
import { randomBytes } from 'node:crypto';

export interface PanelHtmlParts {
  /** `webview.cspSource`: the only origin styles and the script may load from. */
  cspSource: string;
  scriptUri: string;
  styleUri: string;
  nonce: string;
}

/** 128 random bits, base64: a CSP nonce must not be guessable (CSP Level 3, section 7.2). */
export function newNonce(): string {
  return randomBytes(16).toString('base64');
}

function attribute(text: string): string {
  return text.replace(/&/g, '&amp;').replace(/"/g, '&quot;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
}

export function panelHtml({ cspSource, scriptUri, styleUri, nonce }: PanelHtmlParts): string {
  const csp = [
    "default-src 'none'",
    `style-src ${cspSource}`,
    `script-src 'nonce-${nonce}'`,
    "img-src 'none'",
    "connect-src 'none'",
    "form-action 'none'",
    "base-uri 'none'",
  ].join('; ');
  return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta http-equiv="Content-Security-Policy" content="${attribute(csp)}">
<meta name="viewport" content="width=device-width, initial-scale=1">
<link rel="stylesheet" href="${attribute(styleUri)}">
<title>Waveform</title>
</head>
<body>
<header class="bar">
  <div class="heading"><h1 id="block-name">Waveform</h1><span id="block-title" class="muted"></span></div>
  <button id="export" type="button" disabled title="Save this waveform as an SVG file">Export SVG…</button>
</header>
<p id="headline" class="headline"></p>
<ul id="findings" class="findings"></ul>
<div id="chart" class="chart" aria-live="polite"></div>
<p id="readout" class="readout muted">Move the mouse over the plot to read time and values.</p>
<dl id="results" class="results"></dl>
<script type="module" nonce="${attribute(nonce)}" src="${attribute(scriptUri)}"></script>
</body>
</html>`;
}
