import { useState, type CSSProperties } from "react";
import { cn } from "@/lib/cn";
import { frameUrl } from "./frames";

interface Props {
  teamId: string;
  clipId: string;
  frame: number;
  alt: string;
  className?: string;
  /** Width ÷ height of the clip, so the box keeps its shape before the image arrives. */
  aspect?: number;
  eager?: boolean;
  style?: CSSProperties;
}

/** One frame of a clip; a quiet placeholder when the frame is not (or no longer) stored. */
export function FrameImage({ teamId, clipId, frame, alt, className, aspect = 16 / 9, eager = false, style }: Props) {
  const src = frameUrl(teamId, clipId, frame);
  const [failed, setFailed] = useState<string | null>(null);
  return (
    <div className={cn("relative overflow-hidden rounded-lg bg-sunken", className)} style={{ ...style, aspectRatio: String(aspect) }}>
      {failed === src ? (
        <div className="absolute inset-0 flex items-center justify-center p-2 text-center text-xs text-ink-muted">Frame {frame} is not available</div>
      ) : (
        <img src={src} alt={alt} loading={eager ? "eager" : "lazy"} decoding="async" onError={() => setFailed(src)} className="absolute inset-0 size-full object-contain" />
      )}
    </div>
  );
}
