// Command-line arguments: a small parser that says exactly what it did not understand.
export interface ParsedArgs {
  positional: string[];
  flags: Map<string, string[]>;
  /** Every flag with its value in command-line order (`-D X -U X` differs from `-U X -D X`). */
  ordered: Array<[string, string]>;
  problems: string[];
}

export interface FlagSpec {
  /** Takes a value (`--tolerance 2`) rather than standing alone (`--json`). */
  value: boolean;
}

export function parseArgs(argv: string[], specs: Record<string, FlagSpec>): ParsedArgs {
  const parsed: ParsedArgs = { positional: [], flags: new Map(), ordered: [], problems: [] };
  for (let i = 0; i < argv.length; i++) {
    const arg = argv[i];
    if (arg === '--') {
      parsed.positional.push(...argv.slice(i + 1));
      break;
    }
    if (!arg.startsWith('-') || arg === '-') {
      parsed.positional.push(arg);
      continue;
    }
    // A one-letter flag takes its value attached as compilers do (`-DF_CPU=16000000UL`, `-Iinclude`).
    const attached = !arg.startsWith('--') && arg.length > 2 && specs[arg[1]]?.value;
    const [name, inline] = arg.startsWith('--') ? splitInline(arg.slice(2)) : attached ? [arg[1], arg.slice(2)] : [arg.slice(1), undefined];
    const spec = specs[name];
    if (!spec) {
      parsed.problems.push(`unknown option ${arg}`);
      continue;
    }
    let value = 'true';
    if (spec.value) {
      if (inline !== undefined) value = inline;
      else if (i + 1 < argv.length) value = argv[++i];
      else {
        parsed.problems.push(`${arg} needs a value`);
        continue;
      }
    }
    const list = parsed.flags.get(name) ?? [];
    list.push(value);
    parsed.flags.set(name, list);
    parsed.ordered.push([name, value]);
  }
  return parsed;
}

function splitInline(text: string): [string, string | undefined] {
  const eq = text.indexOf('=');
  return eq < 0 ? [text, undefined] : [text.slice(0, eq), text.slice(eq + 1)];
}

export function last(args: ParsedArgs, name: string): string | undefined {
  const list = args.flags.get(name);
  return list ? list[list.length - 1] : undefined;
}
