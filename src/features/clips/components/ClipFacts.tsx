import type { ReactNode } from "react";
import { Card } from "@/components/ui";
import { cameraViewLabels, shotTypeLabels, type ClipDetail } from "@shared/schemas/clips";
import { formatBytes, formatCount, formatFps, formatFrameInterval, sessionLabel } from "../format";

const Row = ({ label, children }: { label: string; children: ReactNode }) => (
  <div className="grid grid-cols-[8rem_1fr] gap-2 py-1.5">
    <dt className="text-ink-muted">{label}</dt>
    <dd className="min-w-0 break-words text-ink">{children}</dd>
  </div>
);

/** What the clip is (player, session, camera) and what the file is (size, codec, rates). */
export function ClipFacts({ clip: c }: { clip: ClipDetail }) {
  const slowdown = c.storedFps ? c.captureFps / c.storedFps : null;
  return (
    <Card title="Details">
      <dl className="divide-y divide-line text-sm">
        <Row label="Player">{c.player?.name ?? "—"}</Row>
        <Row label="Session">{sessionLabel(c.session)}</Row>
        <Row label="Shot type">{shotTypeLabels[c.shotType]}</Row>
        <Row label="Camera view">{cameraViewLabels[c.cameraView]}</Row>
        <Row label="Stick">{c.stick?.label ?? "Not recorded"}</Row>
        <Row label="Capture rate">
          <span className="font-medium">{formatFps(c.captureFps)}</span> {c.captureFpsConfirmed ? "(confirmed)" : "(not confirmed)"}
          <span className="block text-ink-muted">{formatFrameInterval(c.captureFps)} between frames</span>
        </Row>
        <Row label="Stored rate">
          {formatFps(c.storedFps)}
          {slowdown && slowdown > 1.01 && <span className="block text-ink-muted">plays {formatCount(slowdown)}× slower than real time</span>}
        </Row>
        <Row label="Exposure">{c.exposureUs ? `${formatCount(c.exposureUs)} µs` : "—"}</Row>
        <Row label="Frames">{formatCount(c.frameCount)}{c.variableFrameRate && " · variable frame rate (real timestamps kept)"}</Row>
        <Row label="Picture">{c.width && c.height ? `${c.width} × ${c.height} px` : "—"}{c.rotationDeg ? ` · turned ${c.rotationDeg}°` : ""}</Row>
        <Row label="File">{c.originalName} · {formatBytes(c.sizeBytes)} · {c.codec ?? "?"}</Row>
        <Row label="Uploaded by">{c.uploadedBy?.name ?? "—"}</Row>
        {c.notes && <Row label="Notes">{c.notes}</Row>}
      </dl>
    </Card>
  );
}
