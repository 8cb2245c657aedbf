// Command ids, as contributed in package.json.
export const commandIds = {
  showWaveform: 'tickmark.showWaveform',
  checkWorkspace: 'tickmark.checkWorkspace',
  insertBlock: 'tickmark.insertBlock',
  solveBlock: 'tickmark.solveBlock',
  snapToSeries: 'tickmark.snapToSeries',
} as const;
