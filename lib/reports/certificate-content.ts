/**
 * A condition certificate's data, and the content hash the certificate and its verification page
 * both print. The DB layer fills `CertificateData`; nothing here reads the database.
 *
 * The canonical form that is hashed (decisions, tested in tests/unit/reports/certificate-content.test.ts):
 * - Only the facts the certificate states: id, short code, issue time, workspace, part type, model
 *   family, serial, grade, explanation lines, rubric version, the checklist's results and, per
 *   view, the SHA-256 of the photo it was graded on (so the hash also pins the photos). Not the
 *   thumbnails' bytes (re-rendering must not change the hash) and not the URL (hosts change).
 * - Strings NFC-normalised (the same text typed two ways hashes alike); times as ISO 8601 UTC.
 * - Serialised with RFC 8785 JSON Canonicalization (the `canonicalize` package: keys sorted,
 *   no whitespace, ECMAScript number form), with a version field `v` first in meaning, not order.
 * - Hash: SHA-256 of the UTF-8 bytes, lowercase hex; printed in groups of 8 for people.
 */
import { createHash } from "node:crypto";
import canonicalize from "canonicalize";
import type { Grade } from "@/lib/grading/rubric-schema";

export type CertificateChecklistItem = { label: string; result: "pass" | "fail" | "not recorded"; detail?: string };
export type CertificateView = {
  label: string;
  /** SHA-256 (hex) of the photo's original, as stored with the photo. */
  photoSha256: string;
  /** JPEG/PNG thumbnail with the regions drawn in (lib/imaging/annotated-photo.ts); not hashed. */
  thumbnail: Buffer;
};

export type CertificateData = {
  certificateId: string;
  shortCode: string;
  issuedAt: Date;
  workspaceName: string;
  partType: string;
  modelFamily: string;
  serial: string;
  grade: Grade;
  /** One line per rubric rule that fired (the grade's explanation), in the rubric's order. */
  explanation: string[];
  rubric: { name: string; version: number };
  checklist: CertificateChecklistItem[];
  views: CertificateView[];
  /** The verification page's URL for the QR code (carries the signed token). */
  verificationUrl: string;
};

export const CERTIFICATE_CONTENT_VERSION = 1;

const text = (value: string) => value.normalize("NFC");

/** The object that is hashed (see the file head). */
export function certificateContent(data: CertificateData) {
  if (Number.isNaN(data.issuedAt.getTime())) throw new RangeError("The certificate's issue date is not a valid date");
  return {
    v: CERTIFICATE_CONTENT_VERSION,
    certificateId: text(data.certificateId),
    shortCode: text(data.shortCode),
    issuedAt: data.issuedAt.toISOString(),
    workspace: text(data.workspaceName),
    partType: text(data.partType),
    modelFamily: text(data.modelFamily),
    serial: text(data.serial),
    grade: data.grade,
    explanation: data.explanation.map(text),
    rubric: { name: text(data.rubric.name), version: data.rubric.version },
    checklist: data.checklist.map((item) => ({ label: text(item.label), result: item.result, detail: text(item.detail ?? "") })),
    views: data.views.map((view) => ({ label: text(view.label), photoSha256: view.photoSha256.toLowerCase() })),
  };
}

/** RFC 8785 canonical JSON of the certificate's content. */
export function canonicalCertificate(data: CertificateData): string {
  const json = canonicalize(certificateContent(data));
  if (json === undefined) throw new Error("The certificate's content could not be canonicalised");
  return json;
}

/** SHA-256 (lowercase hex) of the canonical JSON. */
export function certificateHash(data: CertificateData): string {
  return createHash("sha256").update(canonicalCertificate(data), "utf8").digest("hex");
}

/** "3f2a…" as "3f2a9c01 77be…" — eight groups of eight for reading aloud or comparing by eye. */
export const groupedHash = (hash: string) => hash.match(/.{1,8}/g)?.join(" ") ?? hash;
