// The report's PDF from its input: pure CPU (layout, fonts, charts), so it runs in a worker thread
// (server/cpu); the event-frame thumbnails are read before, on the main thread (render.ts).
import { createElement } from "react";
import { renderToBuffer, type DocumentProps } from "@react-pdf/renderer";
import type { ReactElement } from "react";
import { registerFonts } from "./fonts";
import { ShotReport, type ReportInput } from "./report";

export async function renderShotReport(input: ReportInput): Promise<Buffer> {
  registerFonts();
  return renderToBuffer(createElement(ShotReport, input) as unknown as ReactElement<DocumentProps>);
}
