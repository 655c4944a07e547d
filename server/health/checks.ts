// Extra readiness checks registered by areas that own a dependency (queue, storage, ffmpeg).
export const readinessChecks: Record<string, () => Promise<unknown>> = {};
