// The waveform panel's script: draws what the host posts, reads values under the mouse, asks for export.
// Data arrives only by postMessage; every text from the document goes in through textContent.
import type { Waveform } from '../core/circuits/model';
import { drawChart } from './chart';
import type { HostMessage, PanelBlock, PanelMessage, PanelState } from './messages';
import { attachReadout } from './readout';

interface VsCodeApi {
  postMessage(message: PanelMessage): void;
  setState(state: PanelState): void;
}
declare function acquireVsCodeApi(): VsCodeApi;

const vscode = acquireVsCodeApi();

function byId<T extends HTMLElement>(id: string): T {
  const node = document.getElementById(id);
  if (!node) throw new Error(`panel element #${id} is missing`);
  return node as T;
}

const view = {
  name: byId('block-name'),
  title: byId('block-title'),
  headline: byId('headline'),
  findings: byId<HTMLUListElement>('findings'),
  chart: byId('chart'),
  readout: byId('readout'),
  results: byId('results'),
  exportButton: byId<HTMLButtonElement>('export'),
};
// The hint is written once, in the HTML shell (extension/panel/html.ts).
const idleReadout = view.readout.textContent ?? '';

let shown: { block: PanelBlock; waveform?: Waveform } | undefined;
let detachReadout: (() => void) | undefined;

function renderText(block: PanelBlock): void {
  view.name.textContent = block.name;
  view.title.textContent = block.title ? `${block.title} · line ${block.line}` : `line ${block.line}`;
  view.headline.textContent = block.headline;
  view.findings.replaceChildren(
    ...block.findings.map((f) => {
      const item = document.createElement('li');
      item.className = `finding ${f.severity}`;
      item.textContent = `${f.severity}: ${f.message}`;
      return item;
    }),
  );
  view.results.replaceChildren(
    ...block.results.flatMap((r) => {
      const term = document.createElement('dt');
      term.textContent = r.label;
      const value = document.createElement('dd');
      value.textContent = r.text;
      return [term, value];
    }),
  );
}

function renderChart(): void {
  detachReadout?.();
  detachReadout = undefined;
  view.readout.textContent = idleReadout;
  if (!shown) return;
  const { block, waveform } = shown;
  const chart = waveform ? drawChart(view.chart, waveform, Math.max(360, view.chart.clientWidth)) : undefined;
  if (!chart || !waveform) {
    const note = document.createElement('p');
    note.className = 'muted';
    note.textContent = block.findings.some((f) => f.severity === 'error') ? 'No waveform while the block has errors.' : 'This circuit has no waveform to draw.';
    view.chart.replaceChildren(note);
  } else detachReadout = attachReadout(chart, waveform.traces, view.readout, idleReadout);
  view.exportButton.disabled = !chart;
  vscode.postMessage({ type: 'drawn', block: block.name, traces: waveform?.traces.length ?? 0, points: chart?.points ?? 0 });
}

function receive(message: HostMessage): void {
  switch (message.type) {
    case 'show':
      shown = { block: message.block, waveform: message.waveform };
      vscode.setState({ uri: message.block.uri, block: message.block.name });
      renderText(message.block);
      renderChart();
      return;
    case 'empty':
      shown = undefined;
      detachReadout?.();
      view.name.textContent = 'Waveform';
      view.title.textContent = '';
      view.headline.textContent = message.reason;
      view.findings.replaceChildren();
      view.results.replaceChildren();
      view.chart.replaceChildren();
      view.readout.textContent = '';
      view.exportButton.disabled = true;
      return;
  }
}

window.addEventListener('message', (event: MessageEvent<HostMessage>) => {
  if (event.data && typeof event.data === 'object' && 'type' in event.data) receive(event.data);
});
view.exportButton.addEventListener('click', () => vscode.postMessage({ type: 'export' }));

// The plot is drawn at the panel's pixel width, so a resize redraws it (once per frame at most).
let resizeFrame = 0;
new ResizeObserver(() => {
  cancelAnimationFrame(resizeFrame);
  resizeFrame = requestAnimationFrame(() => shown && renderChart());
}).observe(view.chart);

vscode.postMessage({ type: 'ready' });
