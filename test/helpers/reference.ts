// A reference tool that is missing on a developer's machine is a skip; in CI, which installs it (.ci/run), the
// same absence means the check is broken, so it fails instead of passing quietly.
export function skipUnlessCi(context: Mocha.Context, reason: string): never {
  if (process.env.CI) throw new Error(`${reason} — CI installs this reference, so its absence is a failure`);
  console.warn(reason);
  context.skip();
}
