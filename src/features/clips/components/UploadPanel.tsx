import { useEffect, useRef, useState, type DragEvent } from "react";
import { Alert, Button, Card, PageSpinner } from "@/components/ui";
import { errorMessage } from "@/lib/api";
import { cn } from "@/lib/cn";
import { useClipOptions } from "@/entities/clip";
import { formatBytes } from "../format";
import { discardUnfinished, unfinishedUploads, type UnfinishedUpload } from "../upload/clipUpload";
import { folderName, frameFiles, zipFrames } from "../upload/folderZip";
import { emptyMeta, type MetaFormValues } from "../upload/metaForm";
import { UploadItem } from "./UploadItem";

interface Queued { key: string; file: File; initial: MetaFormValues; frames?: number }
let nextKey = 0;

/** Drop several clips, fill in each one's details, upload them resumably. */
export function UploadPanel({ teamId }: { teamId: string }) {
  const options = useClipOptions(teamId);
  const [queue, setQueue] = useState<Queued[]>([]);
  const [over, setOver] = useState(false);
  const [startAll, setStartAll] = useState(0);
  const [unfinished, setUnfinished] = useState<UnfinishedUpload[]>([]);
  // The last details typed carry over to the next file: a batch is usually one session and player.
  const last = useRef<MetaFormValues>(emptyMeta());
  const input = useRef<HTMLInputElement>(null);
  const folderInput = useRef<HTMLInputElement>(null);
  const [zipping, setZipping] = useState<{ done: number; total: number } | null>(null);
  const [folderProblem, setFolderProblem] = useState<string | null>(null);

  useEffect(() => {
    void unfinishedUploads(teamId).then(setUnfinished);
  }, [teamId, queue.length]);

  const add = (files: FileList | File[]) => {
    const list = [...files].filter((f) => f.size >= 0);
    setQueue((q) => [...q, ...list.map((file) => ({ key: `u${nextKey++}`, file, initial: { ...last.current, title: "" } }))]);
  };
  // A folder of numbered frames (a lab camera's export) goes up as one ZIP, made here.
  const addFolder = async (picked: File[]) => {
    setFolderProblem(null);
    const frames = frameFiles(picked);
    if (frames.length === 0) {
      setFolderProblem(`That folder holds no PNG, TIFF or JPEG frames (${picked.length} other file${picked.length === 1 ? "" : "s"}). Pick the folder the camera exported the frames to.`);
      return;
    }
    setZipping({ done: 0, total: frames.length });
    try {
      const file = await zipFrames(frames, folderName(picked), (done) => setZipping({ done, total: frames.length }));
      setQueue((q) => [...q, { key: `u${nextKey++}`, file, frames: frames.length, initial: { ...last.current, title: "" } }]);
    } catch (err) {
      setFolderProblem(`The frames could not be read from that folder (${(err as Error).message}). Try again, or upload a ZIP of them.`);
    } finally {
      setZipping(null);
    }
  };
  const onDrop = (e: DragEvent) => {
    e.preventDefault();
    setOver(false);
    if (e.dataTransfer.files.length) add(e.dataTransfer.files);
  };
  const waiting = unfinished.filter((u) => !queue.some((q) => q.file.name === u.fileName && q.file.size === u.size));

  return (
    <Card
      title="Upload clips"
      description="Drop one or more high-frame-rate clips, fill in each one's details, then upload. Large files are sent in parts and continue after a dropped connection or a reload."
      actions={queue.length > 1 ? <Button size="sm" onClick={() => setStartAll((n) => n + 1)}>Upload all</Button> : undefined}
    >
      <div
        onDragOver={(e) => {
          e.preventDefault();
          setOver(true);
        }}
        onDragLeave={() => setOver(false)}
        onDrop={onDrop}
        className={cn(
          "flex flex-col items-center justify-center gap-2 rounded-lg border-2 border-dashed px-6 py-8 text-center transition-colors",
          over ? "border-accent bg-accent-soft" : "border-line-strong bg-sunken/40",
        )}
      >
        <p className="font-medium text-ink">Drag video files or ZIPs of frames here</p>
        <p className="text-sm text-ink-muted">MP4, MOV, MKV or AVI, or a ZIP of numbered PNG, TIFF or JPEG frames; up to 4 GB each</p>
        <div className="flex flex-wrap justify-center gap-2">
          <Button variant="secondary" size="sm" onClick={() => input.current?.click()}>Choose files…</Button>
          <Button variant="secondary" size="sm" disabled={!!zipping} onClick={() => folderInput.current?.click()}>Choose a folder of frames…</Button>
        </div>
        <input
          ref={input}
          type="file"
          multiple
          accept="video/*,.mp4,.mov,.m4v,.mkv,.avi,.zip,application/zip"
          className="sr-only"
          aria-label="Choose clip files"
          data-testid="clip-file-input"
          onChange={(e) => {
            if (e.target.files) add(e.target.files);
            e.target.value = "";
          }}
        />
        <input
          ref={folderInput}
          type="file"
          {...{ webkitdirectory: "" }}
          className="sr-only"
          aria-label="Choose a folder of frames"
          data-testid="clip-folder-input"
          onChange={(e) => {
            if (e.target.files) void addFolder([...e.target.files]);
            e.target.value = "";
          }}
        />
        {zipping && (
          <p className="text-sm text-ink-muted" role="status">
            Putting frames into one ZIP: {zipping.done.toLocaleString()} of {zipping.total.toLocaleString()}…
          </p>
        )}
      </div>
      {folderProblem && <Alert tone="danger" className="mt-4">{folderProblem}</Alert>}

      {waiting.length > 0 && (
        <Alert tone="info" title="Unfinished uploads" className="mt-4">
          <p>Choose the same file again to continue where it stopped:</p>
          <ul className="mt-1.5 flex flex-col gap-1">
            {waiting.map((u) => (
              <li key={u.key} className="flex flex-wrap items-center gap-2">
                <span className="font-medium">{u.title || u.fileName}</span>
                <span className="text-ink-muted">{u.fileName} · {formatBytes(u.size)}</span>
                <Button variant="ghost" size="sm" onClick={() => void discardUnfinished(u).then(() => unfinishedUploads(teamId)).then(setUnfinished)}>
                  Discard
                </Button>
              </li>
            ))}
          </ul>
        </Alert>
      )}

      {queue.length > 0 &&
        (options.isPending ? (
          <PageSpinner label="Loading players and sessions…" />
        ) : options.isError ? (
          <Alert tone="danger" className="mt-4">{errorMessage(options.error)}</Alert>
        ) : (
          <ul className="mt-4 flex flex-col gap-4">
            {queue.map((q) => (
              <UploadItem
                key={q.key}
                idPrefix={q.key}
                file={q.file}
                frames={q.frames}
                teamId={teamId}
                options={options.data}
                initial={q.initial}
                startAll={startAll}
                onValues={(v) => (last.current = v)}
                onRemove={() => setQueue((all) => all.filter((x) => x.key !== q.key))}
              />
            ))}
          </ul>
        ))}
    </Card>
  );
}
