// `npm run demo`: the check over the demo workspace as a user would run it, then one waveform written.
// Exits 0 when the report shows exactly the three planted findings and nothing else went wrong.
import { spawnSync } from 'node:child_process';
import { mkdirSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import path from 'node:path';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const tickmark = path.join(root, 'bin', 'tickmark.js');
const run = (args) => spawnSync(process.execPath, [tickmark, ...args], { cwd: root, encoding: 'utf8' });

console.log('$ tickmark check demo\n');
const human = run(['check', 'demo']);
process.stdout.write(human.stdout);
process.stderr.write(human.stderr);

const planted = [
  { file: 'demo/firmware/src/valve_pwm.c', block: 'valve-pwm', why: 'comment claims 20 kHz; VALVE_PWM_TOP = 999 in board.h gives 16 kHz' },
  { file: 'demo/notes/buzzer.md', block: 'leak-buzzer', why: 'note claims 2.4 kHz; the revision-B parts give about 2 kHz' },
  { file: 'demo/firmware/src/radio_uart.c', block: 'radio-uart', why: 'claims 9600 baud; UART_DIVISOR still assumes the 16 MHz system clock, but the UART sits on the 4 MHz slow bus (@slow-bus in notes/clock-tree.md)' },
];
const json = JSON.parse(run(['check', '--json', 'demo']).stdout);
const problems = [];
const unexpected = [];
for (const file of json.files) {
  for (const block of file.blocks) {
    const serious = block.diagnostics.filter((d) => d.severity !== 'info');
    const plant = planted.find((p) => p.file === file.path && p.block === block.name);
    if (plant) {
      if (!serious.some((d) => d.code === 'expect-mismatch')) problems.push(`planted finding in ${plant.block} was not reported`);
    } else if (serious.length) unexpected.push(`${file.path}:${block.line} ${block.name}: ${serious.map((d) => d.message).join('; ')}`);
  }
}
console.log('\nPlanted on purpose (the demo shows what Tickmark catches):');
for (const p of planted) console.log(`  ${p.file} — ${p.block}: ${p.why}`);

mkdirSync(path.join(root, 'artifacts'), { recursive: true });
const svg = path.join('artifacts', 'heartbeat.svg');
const wave = run(['wave', 'demo/notes/heartbeat.md', '--block', 'heartbeat', '--cycles', '3', '--out', svg]);
if (wave.status !== 0) problems.push(`waveform not written: ${wave.stderr.trim()}`);
else console.log(`\nWaveform of \`heartbeat\` written to ${path.join(root, svg)}`);

if (human.status !== 1) problems.push(`tickmark check exited ${human.status}, expected 1 (the planted findings)`);
for (const u of unexpected) problems.push(`unexpected finding: ${u}`);
if (problems.length) {
  console.error('\nThe demo did not run as designed:\n' + problems.map((p) => `  - ${p}`).join('\n'));
  process.exit(1);
}
console.log('\nDemo ran as designed: exit status 1 from the check is expected, because of the three planted findings.');
