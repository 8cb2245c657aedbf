// The project's identity, read from package.json so the CLI's `--version`, SARIF's tool metadata and the
// links into docs/ cannot drift from the published package.
import pkg from '../package.json';

export const version: string = pkg.version;
/** The project's home page; SARIF `informationUri`. */
export const homepage: string = pkg.homepage;
/** The block-language reference on the web: docs/blocks.md at the published branch. */
export const referenceUrl = `${homepage}/blob/main/docs/blocks.md`;

/** A link to a section of the block-language reference (`#expect-mismatch`, `#values`). */
export function referenceLink(anchor: string): string {
  return `${referenceUrl}#${anchor}`;
}
