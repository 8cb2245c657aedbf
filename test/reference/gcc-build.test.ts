// Reference check: firmware read with its build configuration. The same headers, -D flags and include folders go
// to the compiler firmware is built with (gcc for lp64, arm-none-eabi-gcc for ilp32, avr-gcc for ip16; compiled
// only, values read back from the object file by compileConstants) and to Tickmark; each value, its signedness and
// its size must agree. The shapes are the ones that needed glue on real firmware: -D values, #ifdef configuration
// idioms, <…> headers of an SDK outside the project, <stdint.h>/<limits.h> limits, typedefs through macros, and
// register values written as C in a block.
import { strict as assert } from 'assert';
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { analyzeDocument, defaultAnalyzeOptions, FirmwareCache } from '../../core/analyze';
import { buildConstantTable, type CValue, type DataModel } from '../../core/c';
import { configFromArguments } from '../../core/c/config';
import { typeSystem } from '../../core/c/ctypes';
import { skipUnlessCi } from '../helpers/reference';
import { compileConstants, compilerAvailable, REFERENCE_COMPILERS, type CompiledConstant, type Target } from './gcc-print';

// An invented project: its own headers, and an SDK folder beside it (outside the project's folder).
const FILES: Record<string, string> = {
  'project/config.h': [
    '#ifdef CONF_DIV', '#define DIV CONF_DIV', '#else', '#define DIV 1', '#endif',
    '#if defined(CHIP_A) || defined(CHIP_B)', '#define CHIP_CLOCK_MHZ 48', '#else', '#define CHIP_CLOCK_MHZ 8', '#endif',
    '#if BOARD_REV >= 2', '#define LED_PIN 5', '#else', '#define LED_PIN 4', '#endif',
    '#ifndef F_CPU', '#define F_CPU 1000000UL', '#endif', '',
  ].join('\n'),
  'project/port.h': ['#define PORT_STACK_TYPE uint16_t', 'typedef PORT_STACK_TYPE StackType_t;', '#define PORT_MAX_DELAY ((StackType_t)-1)', ''].join('\n'),
  'sdk/include/vendor/timers.h': [
    '#define TMR_BASE 0x40000400UL', '#define TMR_PSC_SHIFT 4u', '#define TMR_PSC_MASK (0x7u << TMR_PSC_SHIFT)',
    '#define TMR_TICKS(hz, rate) ((hz) / (rate) - 1u)', '#define TMR_DIV_ROUND(a, b) (((a) + (b) / 2u) / (b))', '',
  ].join('\n'),
  'sdk/include/vendor/device.h': '#include <vendor/timers.h>\n#include <stdint.h>\n#define DEVICE_ID 0x1E950Fu\n',
};
const PRELUDE = '#include <limits.h>\n#include "config.h"\n#include "port.h"\n#include <vendor/device.h>\n';

const LIMITS = [
  'UINT8_MAX', 'INT8_MIN', 'UINT16_MAX', 'INT16_MIN', 'INT16_MAX', 'UINT32_MAX', 'INT32_MIN', 'INT32_MAX', 'UINT64_MAX', 'INT64_MIN',
  'UINT8_C(200)', 'UINT16_C(40000)', 'INT32_C(-5)', 'UINT32_C(7)', 'UINT64_C(1)', 'INT64_C(-1)', 'INTMAX_MAX', 'UINTMAX_MAX', 'SIZE_MAX', 'INTPTR_MAX', 'UINTPTR_MAX',
  'CHAR_BIT', 'SCHAR_MIN', 'SCHAR_MAX', 'UCHAR_MAX', 'CHAR_MIN', 'CHAR_MAX', 'SHRT_MIN', 'USHRT_MAX', 'INT_MIN', 'INT_MAX', 'UINT_MAX',
  'LONG_MIN', 'LONG_MAX', 'ULONG_MAX', 'LLONG_MIN', 'ULLONG_MAX', 'UINT16_MAX + 1', 'UINT16_MAX * 2', 'UINT8_MAX << 4',
];
const CONFIGURED = ['DIV', 'CHIP_CLOCK_MHZ', 'LED_PIN', 'F_CPU', 'F_CPU / 64 / 1000 - 1', 'PORT_MAX_DELAY', 'TMR_BASE + 0x10', 'TMR_PSC_MASK', 'TMR_TICKS(F_CPU / 8, 1000u)', 'TMR_DIV_ROUND(F_CPU, 3u)', 'DEVICE_ID >> 8'];

/** Flag sets a build might pass; the first is none at all beyond the include folders. */
const FLAG_SETS = [[], ['-DCONF_DIV=8', '-DCHIP_B', '-DBOARD_REV=3', '-DF_CPU=16000000UL'], ['-DCONF_DIV=(2+2)', '-DF_CPU=20000000UL', '-UF_CPU']];

function typeOf(v: CValue, model: DataModel) {
  return typeSystem(model).named.get(v.type);
}

function agree(got: ReturnType<ReturnType<typeof buildConstantTable>['evaluate']>, expected: CompiledConstant, model: DataModel, label: string): void {
  assert.ok(expected.ok, `the compiler refuses ${label}: ${expected.ok ? '' : expected.diagnostic}`);
  assert.ok(got.ok, `${label}: Tickmark says ${got.ok ? '' : got.message}; the compiler gives ${expected.value}`);
  assert.equal(BigInt(got.value.value).toString(), expected.value.toString(), label);
  const t = typeOf(got.value, model);
  // A typedef's own name (StackType_t) is not a keyword type: its value alone is compared.
  if (t?.kind === 'int') {
    assert.equal(t.signed, expected.signed, `signedness of ${label} (${got.value.type})`);
    assert.equal(Math.max(1, t.bits / 8), expected.size, `size of ${label} (${got.value.type})`);
  }
}

for (const model of ['lp64', 'ilp32', 'ip16'] as Target[]) {
  const compiler = REFERENCE_COMPILERS[model];
  describe(`the build configuration against ${compiler.label}, ${model}`, function () {
    let root = '';
    before(function () {
      if (!compilerAvailable(model)) skipUnlessCi(this, `${compiler.command} is not installed; reference check skipped`);
      root = fs.mkdtempSync(path.join(os.tmpdir(), 'tickmark-build-ref-'));
      for (const [name, text] of Object.entries(FILES)) {
        fs.mkdirSync(path.dirname(path.join(root, name)), { recursive: true });
        fs.writeFileSync(path.join(root, name), text);
      }
    });
    after(() => { if (root) fs.rmSync(root, { recursive: true, force: true }); });

    const tableFor = (flags: string[]) => {
      const args = ['cc', `-I${path.join(root, 'sdk', 'include')}`, ...flags];
      const entry = path.join(root, 'project', 'main.c');
      return buildConstantTable(entry, PRELUDE, {
        dataModel: model, includeDirs: [], workspaceRoots: [path.join(root, 'project')],
        read: (u) => { try { return fs.readFileSync(u, 'utf8'); } catch { return undefined; } },
        config: configFromArguments(args, path.join(root, 'project'), 'test'),
      });
    };
    const compiled = (flags: string[], expressions: string[]) =>
      compileConstants(model, { prelude: PRELUDE, expressions, dir: path.join(root, 'project'), flags: [`-I${path.join(root, 'sdk', 'include')}`, ...flags] });

    it('<stdint.h> and <limits.h> limits and constant macros, with their types', () => {
      const expected = compiled([], LIMITS);
      const table = tableFor([]);
      LIMITS.forEach((expr, i) => agree(table.evaluate(expr), expected[i], model, expr));
    });

    for (const flags of FLAG_SETS) {
      it(`configuration idioms, <…> SDK headers outside the project and register expressions with ${flags.join(' ') || 'no -D'}`, () => {
        const expected = compiled(flags, CONFIGURED);
        const table = tableFor(flags);
        CONFIGURED.forEach((expr, i) => agree(table.evaluate(expr), expected[i], model, `${expr} with ${flags.join(' ') || 'no -D'}`));
      });
    }

    it('without a configuration, a value the build decides is named with its condition, not guessed', () => {
      const [plain] = compiled([], ['DIV']);
      const [divided] = compiled(['-DCONF_DIV=8'], ['DIV']);
      assert.deepEqual([plain, divided].map((c) => c.ok && c.value), [1n, 8n], 'the compiler gives two values');
      const cautious = buildConstantTable(path.join(root, 'project', 'main.c'), '#include "config.h"\n', {
        dataModel: model, includeDirs: [], workspaceRoots: [path.join(root, 'project')], read: (u) => { try { return fs.readFileSync(u, 'utf8'); } catch { return undefined; } },
      });
      const got = cautious.evaluate('DIV');
      assert.ok(!got.ok);
      assert.match(got.message, /`#ifdef CONF_DIV` \(config\.h:1\).*-D CONF_DIV=…/);
    });

    it('register keys of a block are C in the block\'s data model: the values the compiler makes', () => {
      const registers = ['F_CPU / 64 / 1000 - 1', '0x4000 >> 4', '(1u << 12) % 1000', '(uint8_t)0x1F3', '~0u & 0xFF', 'TMR_DIV_ROUND(F_CPU, 1000u) - 1', '0b1010 | 0x10', '-7 / 2 + 10', '100000 / 3'];
      const flags = ['-DF_CPU=16000000UL'];
      const expected = compiled(flags, registers);
      const note = ['#include <stdint.h>', '#include "config.h"', '#include <vendor/device.h>', ...registers.map((r, i) => `/* @timing r${i}\n * circuit: timer\n * clock: 1 MHz\n * prescaler: 1\n * reload: ${r}\n * bits: 32\n * data-model: ${model}\n */`), ''].join('\n');
      const file = path.join(root, 'project', 'regs.c');
      // The build's own database, found at the project folder's root, gives the -I and -D.
      fs.writeFileSync(path.join(root, 'project', 'compile_commands.json'), JSON.stringify([
        { directory: path.join(root, 'project'), file: 'regs.c', arguments: ['cc', '-I../sdk/include', '-DF_CPU=16000000UL', '-c', 'regs.c'] },
      ]));
      const analysis = analyzeDocument({ uri: file, text: note, languageId: 'c' }, {
        ...defaultAnalyzeOptions, workspaceRoots: [path.join(root, 'project')], firmware: new FirmwareCache(),
        read: (u) => { try { return fs.readFileSync(u, 'utf8'); } catch { return undefined; } },
      });
      registers.forEach((r, i) => {
        const e = expected[i];
        assert.ok(e.ok, `${compiler.command} refuses ${r}`);
        const block = analysis.blocks[i];
        assert.equal(block.params.reload, Number(e.value), `reload: ${r} — ${block.findings.map((f) => f.message).join('; ')}`);
      });
    });
  });
}
