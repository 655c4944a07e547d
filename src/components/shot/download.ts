import { ApiError } from "@/lib/api";
import { isProblemCode } from "@shared/schemas/problem-codes";

/**
 * Fetch a file and hand it to the browser as a download, so a refusal (no results yet, no access)
 * becomes a readable message instead of a saved error page.
 */
export async function downloadFile(url: string, fallbackName: string): Promise<void> {
  const res = await fetch(url, { credentials: "same-origin" });
  if (!res.ok) {
    let detail = `The download failed (${res.status}).`;
    try {
      const body = (await res.json()) as { detail?: string; code?: string };
      if (body.detail) detail = body.detail;
      throw new ApiError({ status: res.status, code: isProblemCode(body.code) ? body.code : "download_failed", detail });
    } catch (e) {
      if (e instanceof ApiError) throw e;
      throw new ApiError({ status: res.status, code: "download_failed", detail });
    }
  }
  const name = /filename="([^"]+)"/.exec(res.headers.get("content-disposition") ?? "")?.[1] ?? fallbackName;
  const href = URL.createObjectURL(await res.blob());
  const a = document.createElement("a");
  a.href = href;
  a.download = name;
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(href), 10_000);
}
