// Synthetic inputs for the benchmark: a large firmware file and a long design note, values of our own.

/** A C file of about `lines` lines holding `blocks` timer blocks, each with its own three macros. */
export function generateFirmware(lines: number, blocks: number): string {
  const out: string[] = ['/* generated firmware for the benchmark */', '#define SYS_CLOCK_HZ 48000000u', ''];
  const per = Math.floor((lines - 3) / blocks);
  for (let i = 0; i < blocks; i++) {
    const start = out.length;
    const division = 8 << (i % 4);
    const reload = 1000 + (i % 97);
    out.push(
      `#define TASK${i}_DIV ${division}u`,
      `#define TASK${i}_TOP (SYS_CLOCK_HZ / TASK${i}_DIV / ${1000 + i} - 1u)`,
      `/* @timing task-${i}`,
      ' * circuit: timer',
      ' * clock: SYS_CLOCK_HZ',
      ` * prescaler: TASK${i}_DIV`,
      ` * reload: TASK${i}_TOP`,
      ` * expect: ${1000 + i} Hz ±1%`,
      ' */',
      `void task${i}_init(void)`,
      '{',
      `    timer_set_prescaler(TIMER${i % 8}, TASK${i}_DIV - 1u);`,
      `    timer_set_reload(TIMER${i % 8}, TASK${i}_TOP); /* ${reload} */`,
      '}',
    );
    // Short filler keeps the file under the default size limit (1024 KB), so the check reads it.
    while (out.length - start < per) out.push((out.length - start) % 3 ? 'n++;' : '');
  }
  while (out.length < lines) out.push('/* end filler */');
  return out.join('\n') + '\n';
}

/** A Markdown note of about `lines` lines with `blocks` timing blocks (RC oscillators and delays). */
export function generateNote(lines: number, blocks: number): string {
  const out: string[] = ['# Generated design note', ''];
  const per = Math.floor((lines - 2) / blocks);
  for (let i = 0; i < blocks; i++) {
    const start = out.length;
    const r = 10 + (i % 90);
    out.push(
      `## Stage ${i}`,
      '',
      `\`\`\`timing stage-${i}`,
      'circuit: schmitt-rc',
      'supply: 3.3 V ±5%',
      'vt+: 0.6 * supply',
      'vt-: 0.3 * supply',
      `r: ${r}k ±1%`,
      'c: 100n ±10%',
      '```',
      '',
    );
    while (out.length - start < per) out.push(`Paragraph line ${out.length - start} of stage ${i}: the oscillator feeds the next block.`);
  }
  while (out.length < lines) out.push('');
  return out.join('\n') + '\n';
}

/** The bare regex pass the scan is compared with: find every tag and every `key: value` line. */
export function regexPass(text: string): number {
  let count = 0;
  const pattern = /@timing\b|^\s*\*?\s*[A-Za-z][\w+.-]*\s*:\s*\S.*$/gm;
  while (pattern.exec(text) !== null) count++;
  return count;
}
