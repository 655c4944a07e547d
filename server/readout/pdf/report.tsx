import { FLIGHT_WINDOW_MS } from "../../../shared/mechanics/compute-shot";
import { seriesPoints } from "../../../shared/mechanics/series-columns";
import { Document, Image, Page, StyleSheet, Text, View } from "@react-pdf/renderer";
import { eventLabels, type ShotEventKey } from "../../../shared/schemas/shots";
import { METRICS, convert, eventTimingText, formatValue, metricText, noteMetric, shotTitle, shotTypeLabels, unitOf, type ShotReadout } from "../../../shared/schemas/readout";
import type { UnitSystem } from "../../../shared/units";
import { ReportChart } from "./charts";
import { FONT } from "./fonts";

// The one-page report of a shot: result cards, the phase timeline with the event frames, the
// speed and bend charts, the notes. Everything in the viewer's units.

export interface ReportInput {
  readout: ShotReadout;
  units: UnitSystem;
  teamName: string;
  url: string;
  generatedAt: Date;
  /** JPEG thumbnails of the event frames, where the frames are stored. */
  thumbs: Partial<Record<ShotEventKey, Buffer>>;
}

const C = { ink: "#1b2224", muted: "#556064", faint: "#7d878a", line: "#d9ddd6", accent: "#0b6e69", soft: "#e1f0ee", warn: "#8a5a00", warnSoft: "#fbf1d8", puck: "#0b6e69", blade: "#c2410c", bend: "#5b4bb7" };

const s = StyleSheet.create({
  page: { fontFamily: FONT, fontSize: 8.5, color: C.ink, paddingTop: 30, paddingBottom: 30, paddingHorizontal: 34 },
  eyebrow: { fontSize: 7.5, color: C.accent, fontWeight: 600, letterSpacing: 0.8 },
  title: { fontSize: 17, fontWeight: 600, marginTop: 3 },
  meta: { fontSize: 8.5, color: C.muted, marginTop: 3 },
  section: { fontSize: 9.5, fontWeight: 600, marginTop: 12, marginBottom: 5 },
  cards: { flexDirection: "row", flexWrap: "wrap", gap: 6 },
  card: { width: "32.4%", borderWidth: 0.7, borderColor: C.line, borderRadius: 4, padding: 7, minHeight: 58 },
  cardLabel: { fontSize: 7.5, color: C.muted, fontWeight: 500 },
  cardValue: { fontSize: 16, fontWeight: 600, marginTop: 2 },
  cardUnit: { fontSize: 8.5, color: C.muted },
  note: { fontSize: 6.8, color: C.warn, backgroundColor: C.warnSoft, padding: 3, borderRadius: 2, marginTop: 4 },
  thumbs: { flexDirection: "row", gap: 6 },
  thumb: { width: "24.3%" },
  thumbImg: { width: "100%", height: 105, objectFit: "contain", borderRadius: 3, backgroundColor: "#eceee9" },
  thumbEmpty: { width: "100%", height: 105, borderRadius: 3, backgroundColor: "#eceee9", alignItems: "center", justifyContent: "center" },
  small: { fontSize: 7, color: C.muted },
  charts: { flexDirection: "row", gap: 10 },
  footer: { position: "absolute", bottom: 16, left: 34, right: 34, fontSize: 6.5, color: C.faint },
});

const UNIT_NAMES: Record<UnitSystem, string> = { metric: "metric (km/h, mm, J)", imperial: "imperial (mph, in, ft·lbf)" };

export function ShotReport({ readout: r, units, teamName, url, generatedAt, thumbs }: ReportInput) {
  const res = r.results!;
  const title = shotTitle({ ...r.shot, playerName: r.shot.playerName });
  const meta = [r.shot.playerName ?? "No player set", shotTypeLabels[r.shot.shotType], r.shot.date, r.shot.venue, r.shot.stickLabel ? `stick ${r.shot.stickLabel}` : null]
    .filter(Boolean)
    .join("  ·  ");
  const capture = `${r.clip.captureFps.toLocaleString("en")} fps capture  ·  ${r.clip.calibration === "plane" ? "plane calibration" : "scale-bar calibration"}  ·  units: ${UNIT_NAMES[units]}`;
  const strikeEvents = r.events.filter((e) => e.tFromStrikeMs !== null).map((e) => ({ label: eventLabels[e.key], tMs: e.tFromStrikeMs! }));
  const speed = (v: number) => convert("speed", v, units);
  const generalNotes = res.notes.filter((n) => noteMetric(n.code) === null);

  return (
    <Document title={`Shot readout: ${title}`} author="Loadframe" subject={`${teamName}: ${title}`}>
      <Page size="A4" style={s.page}>
        <Text style={s.eyebrow}>LOADFRAME  ·  SHOT READOUT  ·  {teamName.toUpperCase()}</Text>
        <Text style={s.title}>{title}</Text>
        <Text style={s.meta}>{meta}</Text>
        <Text style={s.meta}>{capture}</Text>

        <Text style={s.section}>Results (value ± standard uncertainty)</Text>
        <View style={s.cards}>
          {METRICS.map((m) => {
            const t = metricText(m, res, units);
            const notes = res.notes.filter((n) => noteMetric(n.code) === m.key);
            return (
              <View key={m.key} style={s.card}>
                <Text style={s.cardLabel}>{m.label}</Text>
                {t ? (
                  <Text style={s.cardValue}>
                    {t.value}
                    <Text style={s.cardUnit}>
                      {t.u !== null ? `  ± ${t.u}` : ""} {t.unit}
                    </Text>
                  </Text>
                ) : (
                  <Text style={[s.small, { marginTop: 6 }]}>{m.key === "storedEnergy" ? "Needs the stick's flex (rated or bench-tested)." : "Not enough marks for this result."}</Text>
                )}
                {notes.map((n) => (
                  <Text key={n.code} style={s.note}>
                    {n.message}
                  </Text>
                ))}
              </View>
            );
          })}
        </View>

        <Text style={s.section}>Phase timeline</Text>
        <View style={s.thumbs}>
          {(["iceStrike", "puckStrike", "peakBend", "release"] as const).map((k) => {
            const e = r.events.find((x) => x.key === k);
            const img = thumbs[k];
            return (
              <View key={k} style={s.thumb}>
                {img ? <Image style={s.thumbImg} src={{ data: img, format: "jpg" }} /> : <View style={s.thumbEmpty}><Text style={s.small}>{e ? "frame not stored" : "not marked"}</Text></View>}
                <Text style={{ fontSize: 8, fontWeight: 600, marginTop: 3 }}>{eventLabels[k]}</Text>
                <Text style={s.small}>{e ? `frame ${e.frame}  ·  ${e.tFromStrikeMs === null ? "" : `${signed(e.tFromStrikeMs)} ms`}` : "not marked"}</Text>
              </View>
            );
          })}
        </View>
        <PhaseBar readout={r} />

        <Text style={s.section}>Speed and bend against time</Text>
        <View style={s.charts}>
          <ReportChart
            width={258}
            height={215}
            yLabel={`speed (${unitOf("speed", units)})`}
            events={strikeEvents}
            lines={[
              { label: "puck", color: C.puck, points: seriesPoints(res.series.puckSpeed), convert: speed },
              { label: "blade", color: C.blade, points: seriesPoints(res.series.bladeSpeed), convert: speed },
            ]}
          />
          <ReportChart width={258} height={215} yLabel="bend angle (°)" events={strikeEvents} lines={[{ label: "bend", color: C.bend, points: seriesPoints(res.series.bendAngle), convert: (v) => v }]}
            emptyText="No bend marks on this shot." />
        </View>

        {(generalNotes.length > 0 || r.stale) && (
          <View style={{ marginTop: 8 }}>
            {r.stale && <Text style={s.note}>These results were computed from an earlier version of the marks.</Text>}
            {generalNotes.map((n) => (
              <Text key={n.code} style={s.note}>
                {n.message}
              </Text>
            ))}
          </View>
        )}
        <Text style={[s.small, { marginTop: 8 }]}>
          Method: zero-lag 2nd-order Butterworth (two passes) on the digitised marks; puck exit speed from a straight-line fit to the puck marks of the first {FLIGHT_WINDOW_MS} ms of flight
          after release; uncertainties from {res.uncertainty.trials} Monte Carlo trials at {res.uncertainty.pixelErrorPx} px per mark, with the smoothing's
          estimated bias; times {eventTimingText(res)}. {shaftLine(r, units)}
        </Text>

        <View style={s.footer} fixed>
          <Text>{url}</Text>
          <Text>
            Generated {generatedAt.toISOString().slice(0, 16).replace("T", " ")} UTC  ·  engine {res.engineVersion}
          </Text>
        </View>
      </Page>
    </Document>
  );
}

const signed = (v: number) => (v > 0 ? `+${v.toFixed(1)}` : v < 0 ? `−${Math.abs(v).toFixed(1)}` : "0.0");

function shaftLine(r: ShotReadout, units: UnitSystem) {
  const d = r.results?.shaftDeflection;
  const st = r.stick;
  const parts: string[] = [];
  if (d) parts.push(`Peak shaft deflection ${formatValue("length", d.valueMm, units)}.`);
  if (st?.flex) parts.push(`Stored energy uses ${st.flexSource === "measured" ? `the measured flex ${st.flex.toFixed(0)} (bench test ${st.testedOn})` : `the rated flex ${st.flex.toFixed(0)}`} of stick ${st.label}.`);
  return parts.join(" ");
}

/** Load and contact as bars in proportion, with peak bend marked. */
function PhaseBar({ readout: r }: { readout: ShotReadout }) {
  const res = r.results!;
  const load = res.loadTimeMs ?? 0;
  const contact = res.contactTimeMs;
  const total = load + contact || 1;
  const peak = r.events.find((e) => e.key === "peakBend")?.tFromStrikeMs ?? null;
  return (
    <View style={{ marginTop: 7 }}>
      <View style={{ flexDirection: "row", height: 14, borderRadius: 3, overflow: "hidden" }}>
        {load > 0 && (
          <View style={{ width: `${(load / total) * 100}%`, backgroundColor: "#f3c969", justifyContent: "center", paddingLeft: 4 }}>
            <Text style={{ fontSize: 7, fontWeight: 600 }}>load {load.toFixed(1)} ms</Text>
          </View>
        )}
        <View style={{ width: `${(contact / total) * 100}%`, backgroundColor: C.soft, justifyContent: "center", paddingLeft: 4 }}>
          <Text style={{ fontSize: 7, fontWeight: 600, color: C.accent }}>contact {contact.toFixed(1)} ms</Text>
        </View>
      </View>
      <View style={{ flexDirection: "row", justifyContent: "space-between", marginTop: 2 }}>
        <Text style={s.small}>{load > 0 ? "ice strike" : "puck strike"}</Text>
        {peak !== null && <Text style={s.small}>peak bend at {signed(peak)} ms from puck strike</Text>}
        <Text style={s.small}>release</Text>
      </View>
    </View>
  );
}
