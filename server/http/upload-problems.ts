// The upload protocol's own error answers (the tus server writes plain text such as
// "Upload-Offset conflict") become problem+json with a stable code, like every other API error.
// Our own hooks already answer JSON problem documents; those only get the right media type.
import { PROBLEM_TYPE, problemJson } from "./problem";

/** tus-node-server's plain-text answers (@tus/utils ERRORS and the server's own), by their first words. */
const TUS_TEXT: [prefix: string, code: string, detail: string][] = [
  ["Upload-Offset conflict", "offset_conflict", "The server holds a different part of this upload; resume from the offset it reports (HEAD)."],
  ["Upload-Offset header required", "offset_required", "Send Upload-Offset with each chunk."],
  ["Content-Type header required", "content_type_required", "Send chunks as Content-Type: application/offset+octet-stream."],
  ["The file for this url was not found", "not_found", "That upload was not found, or you do not have access to it."],
  ["The file for this url no longer exists", "upload_gone", "That upload no longer exists; start it again."],
  ["upload's size exceeded", "too_large", "More bytes were sent than the upload declared."],
  ["Maximum size exceeded", "too_large", "The file is larger than one clip may be."],
  ["Upload-Length or Upload-Defer-Length header required", "length_required", "Send the file's size when the upload starts (Upload-Length)."],
  ["Upload-Metadata is invalid", "metadata_invalid", "Upload-Metadata is garbled: comma-separated keys, each with a base64 value."],
  ["Tus-Resumable Required", "tus_version_required", "Send Tus-Resumable: 1.0.0 with each upload request."],
  ["Invalid ", "invalid_header", "An upload header has a value the protocol does not allow:"],
  ["Cannot terminate an already completed upload", "upload_complete", "That upload has already finished."],
  ["Request aborted due to lock acquired", "upload_busy", "Another request is writing this upload; resume from its offset."],
  ["failed to acquire lock before timeout", "upload_busy", "Another request is still writing this upload; try again in a moment."],
  ["Not found", "not_found", "No such upload route."],
];

export async function asUploadProblem(res: Response): Promise<Response> {
  if (res.status < 400) return res;
  const text = (await res.text()).trim();
  const headers = new Headers(res.headers);
  headers.delete("content-length");
  headers.set("content-type", PROBLEM_TYPE);
  if (text.startsWith("{")) return new Response(text, { status: res.status, headers });
  const known = TUS_TEXT.find(([prefix]) => text.startsWith(prefix));
  const [code, detail] = known
    ? [known[1], known[2].endsWith(":") ? `${known[2]} ${text.slice(known[0].length)}.` : known[2]]
    : [res.status >= 500 ? "internal" : "upload_error", text || "The upload was refused."];
  return new Response(problemJson(res.status, code, detail), { status: res.status, headers });
}
