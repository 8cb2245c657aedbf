// Answers shared by every request handler: a cancelled request, and a result computed for a version of the
// document that is no longer current (dropped, so the client asks again).
import { LSPErrorCodes, ResponseError } from 'vscode-languageserver';

export function cancelled(): ResponseError<void> {
  return new ResponseError(LSPErrorCodes.RequestCancelled, 'request cancelled');
}

export function contentModified(): ResponseError<void> {
  return new ResponseError(LSPErrorCodes.ContentModified, 'the document changed while the answer was computed');
}
