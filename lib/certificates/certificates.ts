import "server-only";
/**
 * Condition certificates (issue 17): a lead issues one for a graded unit, downloads its one-page
 * PDF, and may revoke it. Decisions:
 * - A certificate states the unit's *current* grade (after any override) with its explanation
 *   lines and rubric version, the checklist's results and, per view, the SHA-256 of the photo;
 *   those facts and their hash (certificate-content.ts) are stored when it is issued and never
 *   recomputed, so the buyer's PDF and the verification page agree even after a later regrade.
 * - A unit needs a grade and a recorded serial (a certificate names the part it vouches for).
 * - The QR link carries a signed token valid for CERTIFICATE_LINK_YEARS; the short code works as
 *   long as the row exists. Revocation (with a reason) refuses both from then on.
 * - The PDF's thumbnails are drawn when downloaded, from the stored thumbnails of the photos whose
 *   SHA-256 the certificate states (not hashed: re-drawing must not change the hash).
 */
import { randomUUID } from "node:crypto";
import { transaction } from "@/db/client";
import { logActivity } from "@/db/queries/activity";
import { getCertificate, getUnitForCertificate, insertCertificate, listUnitCertificates, revokeCertificateRow } from "@/db/queries/certificates";
import { lockUnit } from "@/db/queries/units";
import { listRegionsOfPhotos } from "@/db/queries/grading";
import type { Certificate } from "@/db/schema";
import type { SessionUser } from "@/lib/auth/require-user";
import { env } from "@/lib/env";
import { AppError, notFound } from "@/lib/errors";
import type { Shape } from "@/lib/geometry/shape";
import { ANNOTATED_EDGE, renderAnnotatedPhoto } from "@/lib/imaging/annotated-photo";
import { certificateContent, certificateHash, type CertificateData, type CertificateView } from "@/lib/reports/certificate-content";
import { renderCertificatePdf } from "@/lib/reports/certificate-pdf";
import { failureLabel } from "@/lib/reports/lot-report-load";
import { signPublicLink } from "@/lib/reports/public-links";
import { newShortCode } from "@/lib/reports/short-code";
import { getObjectBuffer, objectStore } from "@/lib/storage/s3";

export const CERTIFICATE_LINK_YEARS = 10;

/** The verification page's address for a certificate (the QR code's content). */
export function verificationUrl(certificate: Pick<Certificate, "id" | "linkExpiresAt">): string {
  const token = signPublicLink("certificate", certificate.id, { secret: env().NEXTAUTH_SECRET, expiresAt: certificate.linkExpiresAt });
  return `${env().APP_URL.replace(/\/$/, "")}/verify/${token}`;
}

/** The unit's certificates, newest first, each with the address its QR code holds (404 for another workspace's unit). */
export async function listCertificatesOfUnit(user: SessionUser, unitId: string) {
  if (!(await getUnitForCertificate({ workspaceId: user.workspaceId, unitId }))) throw notFound("That unit");
  const rows = await listUnitCertificates({ workspaceId: user.workspaceId, unitId });
  return rows.map(({ linkExpiresAt, ...row }) => ({ ...row, verificationUrl: verificationUrl({ id: row.id, linkExpiresAt }) }));
}

type UnitFacts = NonNullable<Awaited<ReturnType<typeof getUnitForCertificate>>>;

/** The certificate's facts from the unit as it stands (without thumbnails; the URL is filled when drawn). */
export function certificateFacts(facts: UnitFacts, ids: { certificateId: string; shortCode: string; issuedAt: Date }): CertificateData {
  const { unit, partType, current } = facts;
  if (!current) throw new AppError("conflict", "This unit has no grade yet: a condition certificate states a grade. Grade it on the Bench first.");
  if (!unit.serial) throw new AppError("conflict", "This unit has no serial recorded: a certificate must name the part it vouches for. Record the serial on the Bench first.");
  const results = new Map(facts.results.map((r) => [r.itemId, r]));
  const views: CertificateView[] = facts.photos.map((p) => ({ label: partType.views.find((v) => v.key === p.viewKey)?.label ?? p.viewKey, photoSha256: p.sha256, thumbnail: Buffer.alloc(0) }));
  return {
    ...ids,
    workspaceName: facts.workspaceName,
    partType: partType.name,
    modelFamily: facts.lotModelFamily || partType.modelFamily,
    serial: unit.serial,
    grade: current.grade.finalGrade,
    explanation: current.grade.explanation.lines.map((line) => line.text),
    rubric: { name: `${partType.name} rubric`, version: current.rubricVersion },
    checklist: partType.checklist.map((item) => {
      const result = results.get(item.id);
      if (!result) return { label: item.label, result: "not recorded" as const };
      return { label: item.label, result: result.passed ? ("pass" as const) : ("fail" as const), detail: result.passed ? undefined : failureLabel(item, item.id, result.value) };
    }),
    views,
    verificationUrl: "",
  };
}

export async function issueCertificate(user: SessionUser, unitId: string) {
  return transaction(async (tx) => {
    const locked = await lockUnit(tx, { workspaceId: user.workspaceId, unitId });
    if (!locked) throw notFound("That unit");
    const facts = await getUnitForCertificate({ workspaceId: user.workspaceId, unitId }, tx);
    if (!facts) throw notFound("That unit");
    const issuedAt = new Date();
    const linkExpiresAt = new Date(issuedAt);
    linkExpiresAt.setUTCFullYear(linkExpiresAt.getUTCFullYear() + CERTIFICATE_LINK_YEARS);
    // A short code is random; on the rare clash with an existing one, draw again.
    for (let attempt = 0; attempt < 5; attempt++) {
      const data = certificateFacts(facts, { certificateId: randomUUID(), shortCode: newShortCode(), issuedAt });
      const row = await insertCertificate(tx, {
        id: data.certificateId,
        workspaceId: user.workspaceId,
        unitId,
        gradeId: facts.current!.grade.id,
        shortCode: data.shortCode,
        content: certificateContent(data),
        contentHash: certificateHash(data),
        linkExpiresAt,
        issuedBy: user.id,
        issuedAt,
      });
      if (!row) continue;
      await logActivity(tx, {
        workspaceId: user.workspaceId,
        actorId: user.id,
        action: "certificate.issued",
        subjectType: "unit",
        subjectId: unitId,
        detail: { certificateId: row.id, shortCode: row.shortCode, grade: data.grade },
      });
      return row;
    }
    throw new AppError("conflict", "No free certificate code was found; try again.");
  });
}

export async function revokeCertificate(user: SessionUser, certificateId: string, reason: string) {
  return transaction(async (tx) => {
    const row = await revokeCertificateRow(tx, { workspaceId: user.workspaceId, certificateId, revokedBy: user.id, reason, at: new Date() });
    if (!row) {
      const existing = await getCertificate({ workspaceId: user.workspaceId, certificateId }, tx);
      if (!existing) throw notFound("That certificate");
      throw new AppError("conflict", "This certificate is already revoked.");
    }
    await logActivity(tx, { workspaceId: user.workspaceId, actorId: user.id, action: "certificate.revoked", subjectType: "unit", subjectId: row.unitId, detail: { certificateId, reason } });
    return row;
  });
}

/** The stored facts back as CertificateData, with thumbnails drawn from the photos the certificate names. */
export async function certificateData(row: Certificate): Promise<CertificateData> {
  const c = row.content;
  const facts = await getUnitForCertificate({ workspaceId: row.workspaceId, unitId: row.unitId });
  const photosBySha = new Map((facts?.photos ?? []).map((p) => [p.sha256.toLowerCase(), p]));
  const regionRows = await listRegionsOfPhotos({ workspaceId: row.workspaceId, photoIds: [...photosBySha.values()].map((p) => p.id) });
  const classes = facts?.partType.defectClasses ?? [];
  const store = objectStore();
  const views: CertificateView[] = [];
  for (const view of c.views) {
    const photo = photosBySha.get(view.photoSha256);
    const image = photo?.thumbnailKey ? await getObjectBuffer(store, photo.thumbnailKey) : null;
    let thumbnail: Buffer = Buffer.alloc(0);
    if (photo && image && photo.width && photo.height) {
      const own = regionRows.filter((r) => r.photoId === photo.id);
      const drawn = await renderAnnotatedPhoto({
        image,
        regionSpace: { width: photo.width, height: photo.height },
        regions: own.filter((r) => r.role === "defect" && r.defectClass && r.shape).map((r) => ({ defect: r.defectClass!, shape: r.shape as Shape })),
        surface: own.filter((r) => r.role === "surface" && r.shape).map((r) => r.shape as Shape),
        classes,
        maxEdge: ANNOTATED_EDGE.certificate,
        legend: false,
      });
      thumbnail = drawn.jpeg;
    }
    views.push({ label: view.label, photoSha256: view.photoSha256, thumbnail });
  }
  return {
    certificateId: c.certificateId,
    shortCode: c.shortCode,
    issuedAt: new Date(c.issuedAt),
    workspaceName: c.workspace,
    partType: c.partType,
    modelFamily: c.modelFamily,
    serial: c.serial,
    grade: c.grade,
    explanation: c.explanation,
    rubric: c.rubric,
    checklist: c.checklist.map((item) => ({ label: item.label, result: item.result, detail: item.detail || undefined })),
    views,
    verificationUrl: verificationUrl(row),
  };
}

export async function certificatePdf(user: SessionUser, certificateId: string): Promise<{ pdf: Buffer; row: Certificate }> {
  const row = await getCertificate({ workspaceId: user.workspaceId, certificateId });
  if (!row) throw notFound("That certificate");
  return { pdf: await renderCertificatePdf(await certificateData(row), { timeZone: user.timeZone }), row };
}
