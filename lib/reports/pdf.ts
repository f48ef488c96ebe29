/**
 * Draws a design-check report as a PDF with pdfkit: a title block of Tautline's own design, the inputs,
 * assumptions with sources, statics, dynamic results with plots drawn as vectors, the checks with
 * margins, the study's window, the revision history, the review stamp and the cautions; page numbers.
 */
import path from "node:path";
import PDFDocument from "pdfkit";
import type { ReportCheck, ReportContent } from "./content";
import { headlineDefinitions, headlineFigures } from "./figures";
import { checkMargin, fmtN, fmtQ } from "./format";
import { buildTrack } from "@/sim/track";

/**
 * DejaVu (npm dejavu-fonts-ttf, free licence) has every glyph the report prints (≥ ≈ · ² √ × ⁻ °), which
 * the PDF standard fonts lack. Read from node_modules at run time, beside the app.
 */
const FONT_DIR = path.join(process.cwd(), "node_modules", "dejavu-fonts-ttf", "ttf");
const BODY = "TautlineBody";
const BOLD = "TautlineBold";
const ITALIC = "TautlineItalic";
const MONO = "TautlineMono";
const FONT_FILES: Record<string, string> = {
  [BODY]: "DejaVuSans.ttf",
  [BOLD]: "DejaVuSans-Bold.ttf",
  [ITALIC]: "DejaVuSans-Oblique.ttf",
  [MONO]: "DejaVuSansMono.ttf",
};

const LOADING_WORDS: Record<string, string> = { empty: "empty train", full: "full train (every seat taken)", riders: "some riders" };

export interface ReportReviewLine {
  action: string;
  userName: string | null;
  at: string;
  comment: string | null;
}

export interface ReportStamp {
  status: string;
  /** The review trail (submit, return, approve), oldest first; not part of the content hash. */
  reviews?: ReportReviewLine[];
  reportId: number;
  author: string | null;
  reviewer: string | null;
  approvedAt: string | null;
  contentHash: string;
}

const INK = "#10202e";
const MUTED = "#5f7386";
const ACCENT = "#e08a00";
const MARGIN = 50;
const STATE_COLOUR: Record<string, string> = { pass: "#1f7a3a", caution: "#a36500", fail: "#b3261e" };

type Doc = PDFKit.PDFDocument;

function heading(doc: Doc, text: string) {
  if (doc.y > doc.page.height - 140) doc.addPage();
  doc.moveDown(0.6).font(BOLD).fontSize(12).fillColor(INK).text(text, MARGIN);
  const y = doc.y + 1;
  doc.moveTo(MARGIN, y).lineTo(doc.page.width - MARGIN, y).lineWidth(0.6).strokeColor(ACCENT).stroke();
  doc.moveDown(0.4).font(BODY).fontSize(9).fillColor(INK);
}

/** Two-column rows: label, value. A row moves whole to the next page rather than splitting. */
function rows(doc: Doc, items: [string, string][]) {
  const x2 = MARGIN + 210;
  const w2 = doc.page.width - MARGIN - x2;
  for (const [k, v] of items) {
    doc.font(BODY).fontSize(9);
    const h = Math.max(doc.heightOfString(k, { width: 200 }), doc.heightOfString(v, { width: w2 }));
    if (doc.y + h > doc.page.height - 70) doc.addPage();
    const y = doc.y;
    doc.font(BODY).fillColor(MUTED).text(k, MARGIN, y, { width: 200 });
    doc.font(BODY).fillColor(INK).text(v, x2, y, { width: w2 });
    doc.y = y + h + 2;
  }
  doc.x = MARGIN;
}

function titleBlock(doc: Doc, c: ReportContent, stamp: ReportStamp) {
  const w = doc.page.width - 2 * MARGIN;
  const top = MARGIN;
  // Band with the mark, then a grid of fields: our own layout.
  doc.rect(MARGIN, top, w, 34).fill(INK);
  doc.fillColor("#f5c16c").font(BOLD).fontSize(14).text("TAUTLINE", MARGIN + 12, top + 10);
  doc.fillColor("#ffffff").font(BODY).fontSize(10).text("Design check of a chain lift", MARGIN + 110, top + 12);
  doc.fillColor(ACCENT).font(BOLD).fontSize(10).text(stamp.status.toUpperCase(), MARGIN, top + 12, { width: w - 12, align: "right" });
  // The whole title, wrapped: never cut.
  doc.font(BOLD).fontSize(13).fillColor(INK).text(c.title, MARGIN, top + 42, { width: w });
  const cells: [string, string][] = [
    ["Report", `no. ${stamp.reportId}`],
    ["Organisation", c.organisation],
    ["Lift", `${c.lift.name}${c.lift.site ? `, ${c.lift.site}` : ""}: revision ${c.lift.revision}`],
    ["Scenario", `${c.scenario.name} (no. ${c.scenario.id})`],
    ["Run", c.run ? `no. ${c.run.id}, finished ${c.run.finishedAt?.slice(0, 19).replace("T", " ") ?? "—"} UTC` : "—"],
    ["Units", c.units === "si" ? "SI" : "US customary"],
    ["Author", stamp.author ?? "—"],
    ["Reviewer", stamp.reviewer ? `${stamp.reviewer}, approved ${stamp.approvedAt?.slice(0, 10) ?? ""}` : "not yet approved"],
  ];
  const colW = w / 2;
  let y = doc.y + 6;
  doc.lineWidth(0.6).strokeColor(INK);
  for (let i = 0; i < cells.length; i += 2) {
    // Each cell wraps; the row is as tall as its taller cell (nothing is cut).
    doc.font(BODY).fontSize(9);
    const rowH = 16 + Math.max(...[cells[i], cells[i + 1]].filter(Boolean).map((cell) => doc.heightOfString(cell![1], { width: colW - 10 })));
    for (let j = 0; j < 2; j++) {
      const cell = cells[i + j];
      if (!cell) continue;
      const x = MARGIN + j * colW;
      doc.rect(x, y, colW, rowH).stroke();
      doc.font(BODY).fontSize(7).fillColor(MUTED).text(cell[0].toUpperCase(), x + 5, y + 3, { width: colW - 10 });
      doc.font(BODY).fontSize(9).fillColor(INK).text(cell[1], x + 5, y + 12, { width: colW - 10 });
    }
    y += rowH;
  }
  doc.rect(MARGIN, y, w, 18).stroke();
  doc.font(MONO).fontSize(7.5).fillColor(INK).text(`Content hash (sha256): ${stamp.contentHash}`, MARGIN + 5, y + 5, { width: w - 10 });
  doc.y = y + 26;
  doc.x = MARGIN;
}

function linePlot(doc: Doc, title: string, t: number[], ys: number[], yLabel: (v: number) => string) {
  const w = doc.page.width - 2 * MARGIN;
  const h = 130;
  if (doc.y > doc.page.height - h - 90) doc.addPage();
  doc.font(BOLD).fontSize(9).fillColor(INK).text(title, MARGIN);
  const x0 = MARGIN + 55;
  const y0 = doc.y + 4;
  const pw = w - 65;
  const ph = h - 30;
  const tMax = t[t.length - 1] || 1;
  let lo = Math.min(...ys);
  let hi = Math.max(...ys);
  if (!(hi > lo)) {
    hi = lo + 1;
    lo -= 1;
  }
  doc.lineWidth(0.5).strokeColor(MUTED).rect(x0, y0, pw, ph).stroke();
  doc.font(BODY).fontSize(7).fillColor(MUTED);
  for (let i = 0; i <= 4; i++) {
    const v = lo + ((hi - lo) * i) / 4;
    const y = y0 + ph - (ph * i) / 4;
    doc.text(yLabel(v), MARGIN, y - 3, { width: 52, align: "right" });
    if (i > 0 && i < 4) doc.moveTo(x0, y).lineTo(x0 + pw, y).lineWidth(0.2).strokeColor("#d0d7de").stroke();
  }
  for (let i = 0; i <= 5; i++) {
    const tv = (tMax * i) / 5;
    doc.fillColor(MUTED).text(`${tv.toFixed(1)} s`, x0 + (pw * i) / 5 - 15, y0 + ph + 3, { width: 30, align: "center" });
  }
  doc.lineWidth(0.9).strokeColor(ACCENT);
  ys.forEach((v, i) => {
    const x = x0 + (pw * t[i]) / tMax;
    const y = y0 + ph - (ph * (v - lo)) / (hi - lo);
    if (i === 0) doc.moveTo(x, y);
    else doc.lineTo(x, y);
  });
  doc.stroke();
  doc.y = y0 + ph + 16;
  doc.x = MARGIN;
}

/** A check's value or limit in the reader's units (the engine gives SI: m, W, g, s, plain factors). */
function checkValue(v: number | boolean | null, unit: string, units: "si" | "us"): string {
  if (v === null) return "—";
  if (typeof v === "boolean") return v ? "yes" : "no";
  if (unit === "W") return fmtQ(v, "power", units, 1);
  if (unit === "m") return fmtQ(v, "smallLength", units, 1);
  if (unit === "fraction of room") return `${(v * 100).toFixed(0)} %`;
  return `${fmtN(v)}${unit ? ` ${unit}` : ""}`;
}

function checksTable(doc: Doc, checks: ReportCheck[], units: "si" | "us") {
  const cols = [
    { h: "Check", w: 130 },
    { h: "State", w: 50 },
    { h: "Value", w: 62 },
    { h: "Limit", w: 62 },
    { h: "Margin", w: 42 },
    { h: "Reason", w: 149 },
  ];
  const bottom = doc.page.height - 70;
  const header = (y: number) => {
    let x = MARGIN;
    doc.font(BOLD).fontSize(8).fillColor(INK);
    for (const c of cols) {
      doc.text(c.h, x, y, { width: c.w - 4 });
      x += c.w;
    }
    return doc.y + 3;
  };
  const cellsOf = (ch: ReportCheck) => [ch.label, ch.state, checkValue(ch.value, ch.unit, units), checkValue(ch.limit, ch.unit, units), checkMargin(ch), ch.reason];
  const heightOf = (cells: string[]) =>
    Math.max(
      ...cells.map((text, i) => {
        doc.font(i === 1 ? BOLD : BODY).fontSize(i === 5 ? 7 : 8);
        return doc.heightOfString(text, { width: cols[i].w - 4 });
      }),
    );
  const rowsOut = checks.map((ch) => ({ ch, cells: cellsOf(ch), h: heightOf(cellsOf(ch)) }));
  // The header never stands alone: it starts on a page with room for it and two rows.
  const firstTwo = rowsOut.slice(0, 2).reduce((a, r) => a + r.h + 4, 14);
  if (doc.y + firstTwo > bottom) doc.addPage();
  let y = header(doc.y);
  rowsOut.forEach(({ ch, cells, h }, idx) => {
    // A row never splits; a page break repeats the header. The second-last row takes the last one with
    // it, so no row stands alone at the top of a page.
    const need = idx === rowsOut.length - 2 ? h + rowsOut[idx + 1].h + 8 : h + 4;
    if (y + need > bottom) {
      doc.addPage();
      y = header(MARGIN);
    }
    let x = MARGIN;
    cells.forEach((text, i) => {
      doc.font(i === 1 ? BOLD : BODY).fontSize(i === 5 ? 7 : 8).fillColor(i === 1 ? STATE_COLOUR[ch.state] ?? INK : INK);
      doc.text(text, x, y, { width: cols[i].w - 4 });
      x += cols[i].w;
    });
    y += h + 4;
    doc.moveTo(MARGIN, y - 2).lineTo(doc.page.width - MARGIN, y - 2).lineWidth(0.2).strokeColor("#d0d7de").stroke();
  });
  doc.y = y;
  doc.x = MARGIN;
}

export function drawReportPdf(c: ReportContent, stamp: ReportStamp): Promise<Buffer> {
  const doc = new PDFDocument({
    size: "A4",
    margins: { top: MARGIN, bottom: MARGIN, left: MARGIN, right: MARGIN },
    bufferPages: true,
    info: { Title: c.title, Author: stamp.author ?? "", Subject: "Tautline design check", Creator: "Tautline" },
  });
  for (const [name, file] of Object.entries(FONT_FILES)) doc.registerFont(name, path.join(FONT_DIR, file));
  doc.font(BODY);
  const chunks: Buffer[] = [];
  doc.on("data", (b: Buffer) => chunks.push(b));
  const finished = new Promise<Buffer>((resolve, reject) => {
    doc.on("end", () => resolve(Buffer.concat(chunks)));
    doc.on("error", reject);
  });
  const u = c.units;
  const s = c.inputs;

  titleBlock(doc, c, stamp);
  doc.font(ITALIC).fontSize(8.5).fillColor(ACCENT).text(c.cautions.slice(0, 2).join(" "), MARGIN);

  heading(doc, "1. Inputs");
  const loading = c.scenario.loading;
  rows(doc, [
    ...(c.case ? ([["Case", c.case]] as [string, string][]) : []),
    ["Lift revision", `${c.lift.name}, revision ${c.lift.revision}${c.lift.changeSummary ? ` (${c.lift.changeSummary})` : ""}`],
    ["Lift geometry", `${liftShape(s.lift, u)}, chain from ${fmtQ(s.lift.chainFrom, "length", u)} to ${fmtQ(s.lift.chainTo, "length", u)}`],
    ["Chain", `pitch ${fmtQ(s.chain.pitch, "smallLength", u, 1)}, ${fmtQ(s.chain.massPerLength, "massPerLength", u)}, breaking strength ${fmtQ(s.chain.breakingStrength, "force", u, 1)}, axial stiffness E·A ${fmtQ(s.chain.axialStiffness, "force", u, 0)}`],
    ["Drive", `chain speed ${fmtQ(s.drive.speed, "speed", u)}, ${s.drive.sprocketTeeth}-tooth sprocket, efficiency ${Math.round(s.drive.efficiency * 100)} %`],
    ["Take-up", `mass ${fmtQ(s.takeUp.mass, "mass", u, 0)}, travel ${fmtQ(s.takeUp.travel, "length", u)}`],
    [
      "Train",
      `${c.train.name}: ${s.trains[0]!.cars} cars of ${fmtQ(s.trains[0]!.carMass, "mass", u, 0)} each as run` +
        (loading === "empty" ? "" : ` (empty ${fmtQ(c.train.carMassEmpty, "mass", u, 0)}, ${c.train.seatsPerCar} seats per car)`),
    ],
    ["Loading", LOADING_WORDS[loading] ?? loading],
    ["Entry speed", fmtQ(s.trains[0]!.entrySpeed, "speed", u)],
    ["Run settings", `${s.run.duration} s simulated, ${s.run.segments} chain segments, ${s.run.integrator} integrator`],
  ]);

  heading(doc, "2. Assumptions and their sources");
  rows(doc, c.assumptions.map((a) => [`${a.label}: ${a.value}`, a.source]));

  heading(doc, "3. Statics");
  const st = c.statics;
  rows(doc, [
    ["Steady tension (worst position, drive)", fmtQ(st.steadyTension, "force", u)],
    ["Take-up tension", fmtQ(st.takeUpTension, "force", u)],
    ["Static stretch of the loaded chain", fmtQ(st.loadedStretch, "smallLength", u, 1)],
    ["Take-up travel budget", `${fmtQ(st.takeUp.required, "length", u)} required of ${fmtQ(st.takeUp.travel, "length", u)} (margin ${fmtQ(st.takeUp.margin, "length", u)}): elastic ${fmtQ(st.takeUp.elasticExcursion, "length", u)}, wear ${fmtQ(st.takeUp.wearAllowance, "length", u)}, thermal ${fmtQ(st.takeUp.thermal, "length", u)}`],
    ["Motor power (steady)", fmtQ(st.motorPower, "power", u, 1)],
    ["Drive pull / sprocket torque", `${fmtQ(st.drivePull, "force", u)} / ${fmtQ(st.torque, "torque", u, 0)}`],
    ["Chordal speed variation", `${(st.chordalSpeedVariation * 100).toFixed(2)} %`],
    ["Static safety factor", fmtN(st.safetyFactor)],
    ["Longitudinal wave speed in the chain, √(E·A ÷ mass per length)", fmtQ(st.waveSpeed, "speed", u, 0)],
  ]);

  heading(doc, "4. Dynamic results");
  rows(doc, headlineFigures(c));
  doc.moveDown(0.3).font(BOLD).fontSize(9).fillColor(INK).text("What these figures mean", MARGIN);
  doc.moveDown(0.2);
  rows(doc, headlineDefinitions());
  if (c.series && c.series.t.length > 1) {
    const sr = c.series;
    linePlot(doc, "Highest chain tension against time", sr.t, sr.maxTension, (v) => fmtQ(v, "force", u, 1));
    linePlot(doc, "Train speed against time", sr.t, sr.trainSpeed, (v) => fmtQ(v, "speed", u, 2));
    linePlot(doc, "Take-up position against time", sr.t, sr.takeUpPosition, (v) => fmtQ(v, "length", u, 3));
  }

  heading(doc, "5. Checks");
  checksTable(doc, c.checks, u);

  if (c.study) {
    heading(doc, "6. Study and operating window");
    rows(doc, [
      ["Study", `${c.study.name} (no. ${c.study.id}): ${c.study.done} of ${c.study.cases} cases done`],
      ["Recommended operating window", c.study.window],
    ]);
  }

  const n = c.study ? 7 : 6;
  heading(doc, `${n}. Revision history of the lift`);
  rows(doc, c.revisions.map((rv) => [`Revision ${rv.number} (${rv.createdAt.slice(0, 10)})`, rv.changeSummary ?? "—"]));

  heading(doc, `${n + 1}. Review history`);
  const reviews = stamp.reviews ?? [];
  const ACTION_WORDS: Record<string, string> = { submit: "Submitted for review", return: "Returned to the author", approve: "Approved" };
  rows(
    doc,
    reviews.length
      ? reviews.map((v) => [
          `${v.at.slice(0, 16).replace("T", " ")} UTC`,
          `${ACTION_WORDS[v.action] ?? v.action} by ${v.userName ?? "a former user"}${v.comment ? `: “${v.comment}”` : ""}`,
        ])
      : [["—", `Not yet reviewed (the report is a ${stamp.status} report).`]],
  );

  heading(doc, "Cautions");
  for (const line of c.cautions) doc.font(BODY).fontSize(9).fillColor(INK).text(`• ${line}`, MARGIN);

  // Footer on every page: page numbers and the report number.
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const y = doc.page.height - 35;
    doc.page.margins.bottom = 0;
    doc.font(BODY).fontSize(7.5).fillColor(MUTED);
    doc.text(`Tautline design check no. ${stamp.reportId} · ${stamp.status}`, MARGIN, y, { width: 300, lineBreak: false });
    doc.text(`Page ${i + 1} of ${range.count}`, doc.page.width - MARGIN - 100, y, { width: 100, align: "right", lineBreak: false });
  }
  doc.end();
  return finished;
}

/** The lift's shape in a few words: the parametric angle and incline, or a profile's pieces, main incline and height. */
function liftShape(lift: ReportContent["inputs"]["lift"], u: Parameters<typeof fmtQ>[2]): string {
  if (!lift.profile?.length) return `angle ${lift.angle}°, incline ${fmtQ(lift.inclineLength, "length", u)}`;
  const t = buildTrack(lift);
  return `profile of ${lift.profile.length} pieces, main incline ${fmtN((t.angle * 180) / Math.PI, 1)}° over ${fmtQ(t.crestStart - t.inclineStart, "length", u)}, height ${fmtQ(t.highest.z, "length", u)}`;
}
