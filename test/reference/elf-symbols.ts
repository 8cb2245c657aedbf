// Reads the defined symbols of a relocatable ELF object (32- or 64-bit, little-endian: x86-64, ARM, AVR) with the
// bytes each data symbol covers, following the System V ABI's ELF layout (gABI, "Object Files"), from memory.
// Enough for the reference compilers' constant objects; not a general ELF library.

export interface ElfSymbol {
  /** For a data symbol, its bytes read as a little-endian unsigned integer; for an absolute symbol, its value. */
  value: bigint;
  /** The symbol's bytes (empty for an absolute symbol). */
  bytes: Buffer;
}

const SHT_SYMTAB = 2;
const SHT_NOBITS = 8;
const SHN_ABS = 0xfff1;
const SHN_LORESERVE = 0xff00;

export function readElfSymbols(file: Buffer): Map<string, ElfSymbol> {
  if (file.readUInt32BE(0) !== 0x7f454c46) throw new Error('not an ELF file');
  const is64 = file[4] === 2;
  if (file[5] !== 1) throw new Error('big-endian ELF is not read here');
  const word = (at: number): number => file.readUInt32LE(at);
  const addr = (at: number): number => (is64 ? Number(file.readBigUInt64LE(at)) : word(at));
  const shoff = addr(is64 ? 0x28 : 0x20);
  const shentsize = file.readUInt16LE(is64 ? 0x3a : 0x2e);
  const shnum = file.readUInt16LE(is64 ? 0x3c : 0x30);
  const sections = Array.from({ length: shnum }, (_, i) => {
    const at = shoff + i * shentsize;
    return is64
      ? { type: word(at + 4), offset: addr(at + 0x18), size: addr(at + 0x20), link: word(at + 0x28), entsize: addr(at + 0x38) }
      : { type: word(at + 4), offset: word(at + 0x10), size: word(at + 0x14), link: word(at + 0x18), entsize: word(at + 0x24) };
  });
  const symtab = sections.find((s) => s.type === SHT_SYMTAB);
  const symbols = new Map<string, ElfSymbol>();
  if (!symtab) return symbols;
  const strtab = sections[symtab.link];
  const nameAt = (offset: number): string => {
    const start = strtab.offset + offset;
    return file.toString('latin1', start, file.indexOf(0, start));
  };
  for (let at = symtab.offset; at < symtab.offset + symtab.size; at += symtab.entsize) {
    const name = nameAt(word(at));
    const [value, size, shndx] = is64
      ? [file.readBigUInt64LE(at + 8), Number(file.readBigUInt64LE(at + 16)), file.readUInt16LE(at + 6)]
      : [BigInt(word(at + 4)), word(at + 8), file.readUInt16LE(at + 14)];
    if (!name || shndx === 0) continue;
    if (shndx === SHN_ABS) { symbols.set(name, { value, bytes: Buffer.alloc(0) }); continue; }
    if (shndx >= SHN_LORESERVE) continue;
    const section = sections[shndx];
    const bytes = section.type === SHT_NOBITS ? Buffer.alloc(size) : file.subarray(section.offset + Number(value), section.offset + Number(value) + size);
    let integer = 0n;
    for (let i = bytes.length - 1; i >= 0; i--) integer = (integer << 8n) | BigInt(bytes[i]);
    symbols.set(name, { value: integer, bytes });
  }
  return symbols;
}
