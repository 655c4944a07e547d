// Web Worker entry of the tracking assist; the message protocol is described in protocol.ts.
// Bundled by Vite: new Worker(new URL("./track.worker.ts", import.meta.url), { type: "module" }).
import cvModule from "@techstark/opencv-js";
import { provideOpenCv } from "@shared/tracking/opencv";
import { createTrackHost } from "./track-host";

provideOpenCv(cvModule); // the static import: a bundle must never await the module (see opencv.ts)

const host = createTrackHost({ post: (m) => self.postMessage(m) });
self.onmessage = (e: MessageEvent) => void host.handle(e.data);
