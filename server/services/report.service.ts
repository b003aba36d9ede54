import { QueryTypes } from 'sequelize';
import type { AppDeps } from '../deps';
import type { ShopContext } from '../auth/context';
import { AppError } from '../lib/errors';
import { Shop } from '../models';
import type { DiagnosisRecord } from '@shared/schema/bench';
import { getRecord } from './diagnosis.service';
import { audit } from './audit';
import { localeFormat, type LocaleFormat } from '@shared/format/locale';

/** The shop's locale for the texts it is sent; with the time zone named, since mail is read elsewhere. */
async function shopFormat(ctx: ShopContext): Promise<{ shop: Shop | null; fmt: LocaleFormat }> {
  const shop = await Shop.findByPk(ctx.shopId);
  return { shop, fmt: localeFormat(shop?.locale, { withTimeZone: true }) };
}

const esc = (s: unknown) => String(s ?? '').replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

interface RecordStep {
  seq: number; stepId: string; kind: string; shown: { title?: string; limitsText?: string; unit?: string }; entered: string | null;
  verdict: string | null; superseded: boolean; note: string; answerId: string | null;
}

const VERDICT_WORDS: Record<string, string> = {
  within: 'within limits', below: 'below limits', above: 'above limits',
  'borderline-low': 'borderline (low)', 'borderline-high': 'borderline (high)',
};

function stepLine(s: RecordStep, fmt: LocaleFormat): string {
  const answer = s.entered ?? s.answerId ?? (s.kind === 'task' ? 'done' : '');
  const verdict = s.verdict ? ` — ${VERDICT_WORDS[s.verdict] ?? s.verdict}` : '';
  const limits = s.shown.limitsText ? ` (limits ${fmt.decimals(s.shown.limitsText)})` : '';
  return `${s.seq}. ${s.shown.title ?? s.stepId}: ${answer}${limits}${verdict}${s.superseded ? ' [changed later]' : ''}${s.note ? `\n   Note: ${s.note}` : ''}`;
}

function outcomeText(r: DiagnosisRecord): string[] {
  const o = (r.outcome ?? {}) as { partsFitted?: { name: string; lot: string }[]; finalCheck?: { spark: boolean; runs: boolean; stops: boolean }; labourMinutes?: number; reason?: string };
  const end = (r.steps as unknown as RecordStep[]).find((s) => s.stepId === r.endingStepId && !s.superseded);
  const lines: string[] = [];
  if (r.status === 'finished') {
    const shown = (end?.shown ?? {}) as { cause?: string; repair?: string };
    lines.push(`Finding: ${shown.cause ?? r.endingStepId}`, `Repair: ${shown.repair ?? ''}`);
    lines.push(`Parts fitted: ${(o.partsFitted ?? []).map((p) => `${p.name}${p.lot ? ` (lot ${p.lot})` : ''}`).join(', ') || 'none'}`);
    if (o.finalCheck) lines.push(`Final check: spark ${o.finalCheck.spark ? 'yes' : 'NO'}, runs ${o.finalCheck.runs ? 'yes' : 'NO'}, every stop path stops ${o.finalCheck.stops ? 'yes' : 'NO'}`);
    lines.push(`Labour: ${o.labourMinutes ?? 0} min`);
  } else if (r.status === 'handed_off') {
    lines.push(`Handed off: ${o.reason ?? ''}`);
  } else {
    lines.push(`Status: ${r.status}`);
  }
  return lines;
}

function reportText(r: DiagnosisRecord, fmt: LocaleFormat): string {
  return [
    `Diagnosis report — ${r.procedureTitle} (version ${r.versionNumber})`,
    `Machine: ${r.vehicleLabel} ${r.vehicleModel} ${r.vehicleFrameNumber}`.trim(),
    `Technician: ${r.technicianName}`, `Complaint: ${r.complaint}`, `Started: ${fmt.dateTime(r.startedAt)}`, '',
    'Steps:', ...(r.steps as unknown as RecordStep[]).map((s) => stepLine(s, fmt)), '', ...outcomeText(r), '',
    "Limits shown are those of the procedure version; the manufacturer's service data and local regulations come first.",
  ].join('\n');
}

function reportHtml(r: DiagnosisRecord, fmt: LocaleFormat, thumbs: string[]): string {
  const rows = (r.steps as unknown as RecordStep[]).map((s) =>
    `<tr><td>${s.seq}</td><td>${s.superseded ? '<del>' : ''}${esc(s.shown.title ?? s.stepId)}${s.superseded ? '</del> (changed later)' : ''}</td>` +
    `<td>${esc(s.entered ?? s.answerId ?? (s.kind === 'task' ? 'done' : ''))}</td><td>${esc(fmt.decimals(s.shown.limitsText ?? ''))}</td>` +
    `<td>${esc(s.verdict ? VERDICT_WORDS[s.verdict] : '')}</td><td>${esc(s.note)}</td></tr>`).join('');
  return `<h1>${esc(r.procedureTitle)} — ${esc(r.vehicleLabel)}</h1>
<p>Technician: ${esc(r.technicianName)}<br>Complaint: ${esc(r.complaint)}<br>Started: ${esc(fmt.dateTime(r.startedAt))}</p>
<table border="1" cellpadding="4" cellspacing="0"><tr><th>#</th><th>Step</th><th>Entered</th><th>Limits</th><th>Verdict</th><th>Note</th></tr>${rows}</table>
<p>${outcomeText(r).map(esc).join('<br>')}</p>
${thumbs.map((cid) => `<img src="cid:${cid}" alt="Photo" width="160">`).join(' ')}
<p><small>The manufacturer's service data and local regulations come first; the limits shown are those of the procedure version.</small></p>`;
}

async function thumbnails(deps: AppDeps, ctx: ShopContext, id: string) {
  const rows = await deps.sequelize.query<{ id: string; thumb_key: string }>(
    'SELECT id, thumb_key FROM attachments WHERE diagnosis_id = :id AND shop_id = :shopId AND thumb_key IS NOT NULL ORDER BY created_at LIMIT 12',
    { replacements: { id, shopId: ctx.shopId }, type: QueryTypes.SELECT });
  return Promise.all(rows.map(async (a) => {
    const obj = await deps.store.get(a.thumb_key);
    return { filename: `photo-${a.id.slice(0, 8)}.jpg`, content: obj.body, contentType: obj.contentType, cid: `thumb-${a.id}` };
  }));
}

/** E-mails the readable report (readings, verdicts, finding, parts, photo thumbnails) to the service desk. */
export async function emailReport(deps: AppDeps, ctx: ShopContext, id: string, to?: string): Promise<{ sentTo: string }> {
  const record = await getRecord(deps, ctx, id);
  const { shop, fmt } = await shopFormat(ctx);
  const desk = to ?? String((shop?.settings as { serviceDeskEmail?: string } | undefined)?.serviceDeskEmail ?? '');
  if (!desk) throw new AppError(400, 'no_service_desk', 'This shop has no service desk e-mail yet. Ask an admin to set it under Shop settings, or type an address.');
  const attachments = await thumbnails(deps, ctx, id);
  await deps.mailer.send({
    to: desk, subject: `Diagnosis report: ${record.vehicleLabel} — ${record.procedureTitle}`,
    text: reportText(record, fmt), html: reportHtml(record, fmt, attachments.map((a) => a.cid)), attachments,
  });
  await audit({ shopId: ctx.shopId, userId: ctx.userId, action: 'diagnosis.report_sent', entity: 'diagnosis', entityId: id, detail: { to: desk } });
  return { sentTo: desk };
}

/** Tells the shop's leads that a machine was handed on; a mail failure is logged, never lost silently. */
export async function notifyHandoff(deps: AppDeps, ctx: ShopContext, id: string): Promise<void> {
  try {
    const record = await getRecord(deps, ctx, id);
    const leads = await deps.sequelize.query<{ email: string }>(
      `SELECT u.email FROM memberships m JOIN users u ON u.id = m.user_id WHERE m.shop_id = :shopId AND 'lead' = ANY(m.roles)`,
      { replacements: { shopId: ctx.shopId }, type: QueryTypes.SELECT });
    if (!leads.length) return;
    const { fmt } = await shopFormat(ctx);
    await deps.mailer.send({
      to: leads.map((l) => l.email), subject: `Hand-off: ${record.vehicleLabel} needs a senior technician`,
      text: reportText(record, fmt), html: reportHtml(record, fmt, []),
    });
  } catch (err) {
    deps.log(`hand-off e-mail for diagnosis ${id} failed`, err);
  }
}
