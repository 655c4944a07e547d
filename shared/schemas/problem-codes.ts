// Every machine `code` an API error answer (problem+json, RFC 9457) can carry: the server's
// HttpError takes only these, and the client types its ApiError with the same list, so one
// failure has one name on both sides (a refused input is `validation_failed`, never a synonym).

/** An unusable uploaded file (422), each named for what is wrong with it. */
export const MEDIA_INPUT_CODES = [
  "empty_file", "not_media", "truncated_file", "audio_only", "no_video_stream", "image_not_video", "no_decodable_frames", "pixel_size_over_limit",
  // image sequences (decision 134), each naming the file at fault
  "sequence_rate_missing", "sequence_not_images", "sequence_mixed", "sequence_unnumbered", "sequence_gap", "sequence_too_short",
  "sequence_mixed_sizes", "sequence_unreadable_image", "sequence_unsafe_archive", "sequence_too_large",
] as const;

/** The resumable upload protocol's own refusals (server/http/upload-problems.ts). */
export const UPLOAD_PROTOCOL_CODES = [
  "offset_conflict", "offset_required", "content_type_required", "upload_gone", "length_required", "metadata_invalid", "metadata_missing",
  "tus_version_required", "invalid_header", "upload_complete", "upload_busy", "upload_error",
] as const;

/** Codes of the sign-in library's own answers that the product acts on (passed through lower-cased). */
export const AUTH_LIBRARY_CODES = ["invalid_email_or_password", "invalid_token", "auth_error"] as const;

export const PROBLEM_CODES = [
  // any route
  "validation_failed", "malformed_json", "too_large", "unsupported_media_type", "method_not_allowed", "bad_request",
  "unauthenticated", "forbidden", "not_found", "cross_site_request", "rate_limited", "database_unavailable", "storage_unwritable", "disk_full",
  "internal", "busy",
  // clips and frames
  "duplicate_clip", "quota_exceeded", "clip_not_ready", "frame_not_ready", "no_such_frame", "strip_not_ready", "thumbnail_not_ready", "not_failed",
  // shots, tracking and results
  "version_conflict", "shot_deleted", "shot_not_usable", "no_results", "tracking_busy",
  // team members, invitations and sign-up
  "already_invited", "already_member", "last_admin", "invitation_cancelled", "invitation_closed", "invitation_expired", "invitation_used",
  "account_exists", "wrong_account", "signup_link_expired", "signup_link_used", "switch_failed", "invalid_url",
  // plans and payments
  "plan_limit", "read_only_unpaid", "already_subscribed", "no_subscription", "not_a_paid_plan", "same_plan", "payments_off", "payments_error",
  "bad_signature",
  ...MEDIA_INPUT_CODES,
  ...UPLOAD_PROTOCOL_CODES,
  ...AUTH_LIBRARY_CODES,
] as const;

export type ProblemCode = (typeof PROBLEM_CODES)[number];
export type MediaInputCode = (typeof MEDIA_INPUT_CODES)[number];

const known = new Set<string>(PROBLEM_CODES);
export const isProblemCode = (c: unknown): c is ProblemCode => typeof c === "string" && known.has(c);
