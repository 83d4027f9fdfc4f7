// The recommendation report as a PDF, drawn with pdfkit from a frozen version's content, with the
// app's own Nunito Sans embedded (set by file path: registering by alias re-parses the font per cell).
import { createRequire } from "node:module";
import path from "node:path";
import PDFDocument from "pdfkit";
import { lineAmount, reasonsBesideDecision, unpricedNote, type ReportContent } from "../../survey/report";

const require = createRequire(import.meta.url);
const fontDir = path.dirname(require.resolve("@expo-google-fonts/nunito-sans/package.json"));
const FONT = {
  regular: path.join(fontDir, "400Regular", "NunitoSans_400Regular.ttf"),
  bold: path.join(fontDir, "700Bold", "NunitoSans_700Bold.ttf"),
  heavy: path.join(fontDir, "800ExtraBold", "NunitoSans_800ExtraBold.ttf"),
};
const SLATE = "#1F3A34";
const COPPER = "#A65D26";
const INK = "#17211D";
const MUTED = "#4A5853";

const LABELS: Record<string, string> = {
  poe: "PoE",
  poe_splitter: "PoE + splitter",
  existing_outlet: "existing outlet",
  new_outlet: "new outlet (electrician)",
  cannot_power: "can't power here",
};

export function renderReportPdf(content: ReportContent, hash: string): Promise<Buffer> {
  const doc = new PDFDocument({ size: "A4", margins: { top: 56, bottom: 64, left: 56, right: 56 }, bufferPages: true, info: { Title: `${content.site.name} — scope version ${content.version}`, Author: content.team, Creator: "Dropwise" } });
  const chunks: Buffer[] = [];
  doc.on("data", (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve) => doc.on("end", () => resolve(Buffer.concat(chunks))));
  const width = doc.page.width - 112;

  const heading = (text: string) => {
    if (doc.y > doc.page.height - 160) doc.addPage();
    doc.moveDown(0.8).font(FONT.heavy).fontSize(15).fillColor(SLATE).text(text).moveDown(0.3);
    doc.font(FONT.regular).fontSize(10).fillColor(INK);
  };
  const para = (text: string, opts: { muted?: boolean; bold?: boolean } = {}) =>
    doc.font(opts.bold ? FONT.bold : FONT.regular).fontSize(10).fillColor(opts.muted ? MUTED : INK).text(text, { width });

  // Cover
  doc.rect(0, 0, doc.page.width, 190).fill(SLATE);
  doc.font(FONT.heavy).fontSize(12).fillColor("#C47A3C").text("DROPWISE · RECOMMENDATION REPORT", 56, 60);
  doc.font(FONT.heavy).fontSize(26).fillColor("#F7F4EE").text(content.site.name, 56, 84, { width });
  doc.font(FONT.regular).fontSize(12).fillColor("#B9CBC4").text(content.site.address || " ", { width });
  doc.text(`Version ${content.version} · published ${content.publishedAt.slice(0, 10)} · by ${content.team}`, { width });
  doc.fillColor(INK).font(FONT.regular).fontSize(9).text(`Content hash (SHA-256): ${hash}`, 56, 210, { width });

  heading("Summary");
  const s = content.summary;
  para(`${s.devices} devices are planned. ${s.onPoe} get power and data over one cable (PoE); ${s.onSplitters} use PoE with a splitter that turns it into the plug they need; ${s.onExistingOutlets} stay on an existing outlet or transformer; ${s.newOutlets} need a new outlet or transformer, installed by a licensed electrician${s.cannotPower ? `; ${s.cannotPower} cannot be powered as captured` : ""}.`);
  para(`The PoE switches reserve ${s.poeReservedW} W for these devices and are expected to deliver about ${s.poeExpectedW} W.`);
  para(
    s.mustStayUp
      ? `${s.staysUpOnBattery} of the ${s.mustStayUp} devices that must keep working in a power cut stay up on the battery${s.shortestRuntimeMin !== null ? `, the shortest for about ${s.shortestRuntimeMin} minutes` : ""}.`
      : "No device was marked as having to keep working in a power cut.",
  );

  for (const room of content.rooms) {
    heading(`${room.name}${room.floor ? ` · ${room.floor}` : ""}`);
    for (const d of room.devices) {
      if (doc.y > doc.page.height - 140) doc.addPage();
      doc.font(FONT.bold).fontSize(11).fillColor(INK).text(`${d.name} — ${d.label}`, { width });
      if (d.decision) doc.font(FONT.bold).fontSize(9).fillColor(COPPER).text(`Designer decision: ${d.decision.reason} (${d.decision.by})`, { width });
      for (const w of d.plain ?? []) doc.font(FONT.regular).fontSize(10).fillColor(INK).text(w, { width, indent: 8 });
      const reasons = reasonsBesideDecision(d);
      if (d.plain !== undefined && reasons.length) doc.font(FONT.bold).fontSize(8).fillColor(MUTED).text("Technical detail, for your installer", { width, indent: 8 });
      for (const r of reasons) doc.font(FONT.regular).fontSize(d.plain === undefined ? 9 : 8).fillColor(MUTED).text(`• ${r}`, { width, indent: 8 });
      for (const w of d.warnings) doc.font(FONT.bold).fontSize(9).fillColor(COPPER).text(`! ${w}`, { width, indent: 8 });
      doc.moveDown(0.4);
    }
  }

  if (content.switches.length) {
    heading("Switch budgets");
    for (const sw of content.switches) {
      if (doc.y > doc.page.height - 120) doc.addPage();
      para(`${sw.name} (${sw.standard}): ${sw.reservedW} W reserved, ${sw.expectedW} W expected, of ${sw.budgetW} W (planning ceiling ${sw.ceilingW} W); ${sw.portsUsed} of ${sw.ports} PoE ports used${sw.overBudget ? " — OVER BUDGET" : ""}.`);
      const y = doc.y + 4;
      const scale = width / Math.max(sw.budgetW, sw.reservedW, 1);
      doc.rect(56, y, width, 12).fill("#EEF3F0");
      doc.rect(56, y, Math.min(sw.reservedW, sw.budgetW * 1.2) * scale, 12).fill("#C47A3C");
      doc.rect(56, y + 14, Math.min(sw.expectedW, sw.budgetW * 1.2) * scale, 8).fill(SLATE);
      doc.moveTo(56 + sw.ceilingW * scale, y - 3).lineTo(56 + sw.ceilingW * scale, y + 25).lineWidth(1.5).stroke(INK);
      doc.y = y + 32;
      doc.font(FONT.regular).fontSize(8).fillColor(MUTED).text("Copper: class reservation · green: expected draw · line: planning ceiling", 56, doc.y, { width });
    }
  }

  if (content.outage.length) {
    heading("On battery");
    const max = Math.max(1, ...content.outage.map((o) => o.minutes ?? 0));
    for (const o of content.outage) {
      if (doc.y > doc.page.height - 100) doc.addPage();
      const y = doc.y;
      doc.font(FONT.regular).fontSize(9).fillColor(INK).text(o.name, 56, y, { width: 170 });
      if (o.staysUp && o.minutes !== null) {
        doc.rect(232, y + 2, ((width - 236) * o.minutes) / max, 9).fill(SLATE);
        doc.font(FONT.bold).fontSize(9).fillColor(INK).text(`${o.minutes} min`, 56 + width - 50, y, { width: 50, align: "right" });
      } else {
        doc.font(FONT.bold).fontSize(9).fillColor(COPPER).text(`goes down: ${o.reason}`, 232, y, { width: width - 176 });
      }
      doc.y = Math.max(doc.y, y + 16);
      doc.x = 56;
    }
  }

  if (content.cableRuns.length) {
    heading("Cable runs");
    for (const c of content.cableRuns) para(`${c.name}: ${c.length} of ${c.category}${c.ok ? "" : ` — ${c.note}`}`, { muted: c.ok });
  }

  heading("Materials");
  for (const line of content.materials.lines) para(`${line.quantity} ${line.unit} · ${line.description} · ${lineAmount(line, content.materials.currency)}`);
  para(`Total: ${content.materials.total.toFixed(2)} ${content.materials.currency}`, { bold: true });
  const unpriced = unpricedNote(content.materials);
  if (unpriced) para(unpriced);

  heading("Cautions");
  for (const c of content.cautions) para(`• ${c.text}`);
  para("Mains wiring (new outlets, doorbell transformers, hard-wired battery backups) is work for a licensed electrician. Local codes and the authority having jurisdiction decide.", { bold: true });

  heading("Where the numbers come from");
  for (const st of content.standards) para(`• ${st}`, { muted: true });
  para(`Recommendations: ${Object.values(LABELS).join(" · ")}.`, { muted: true });

  // Footer on every page: the version and hash the client signs.
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const bottom = doc.page.margins.bottom;
    doc.page.margins.bottom = 0;
    doc.font(FONT.regular).fontSize(8).fillColor(MUTED).text(`Dropwise · ${content.site.name} · version ${content.version} · ${hash.slice(0, 16)} · page ${i + 1} of ${range.count}`, 56, doc.page.height - 40, { width, align: "center", lineBreak: false });
    doc.page.margins.bottom = bottom;
  }
  doc.end();
  return done;
}
