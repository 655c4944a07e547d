import { Alert } from "@/components/ui";
import { describeClipTiming, timingIrregular, type ClipDetail } from "@shared/schemas/clips";

/** A clip whose frame clock has real gaps, repeats or a missing end: where, and what it means for results. */
export function TimingWarning({ clip }: { clip: Pick<ClipDetail, "timing"> }) {
  if (!clip.timing || !timingIrregular(clip.timing)) return null;
  return (
    <Alert tone="warn" title="Frames missing or repeated in this clip">
      <ul className="list-disc pl-5" data-testid="timing-irregularities">
        {describeClipTiming(clip.timing).map((line) => (
          <li key={line}>{line}</li>
        ))}
      </ul>
      <p className="mt-1.5">
        Speeds and times use each frame's own capture time, so they stay right across a gap; but nothing was filmed in the missing
        time, and results whose frames span a gap carry a note saying so.
      </p>
    </Alert>
  );
}
