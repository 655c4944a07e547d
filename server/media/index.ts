// Media entry point: probing uploads, extracting frames, and the one ffmpeg wrapper under both.
export * from "./errors";
export { runTool, withJobDir, sweepStaleJobDirs, JOB_DIR_PREFIX, type MediaConfig, type MediaLogger, type RunOptions, type RunResult } from "./ffmpeg";
export { probe, looksLikePlaybackRate, type ProbeOptions, type ProbeResult, type Rotation } from "./probe";
export {
  deinterlace,
  hdrToSdr,
  extractFrames,
  frameFileName,
  type ExtractOptions,
  type ExtractProbe,
  type ExtractProgress,
  type ExtractResult,
  type FrameFormat,
  type StripOptions,
} from "./extract";
export { extractClipFrames, jobTmpRoot, type ExtractClipOptions, type ExtractClipResult } from "./ingest";
export { buildGraySpec, decodeGrayFrames, grayFfmpegArgs, type GrayDecodeOptions, type GraySpecInput } from "./gray";
