import type { StoredPhotoResult } from "@/lib/grading/stored-measurement";
import type { Calibration, DefectMeasure } from "@/lib/measure/types";

export type MeasurementLabels = { defects: Record<string, string>; zones: Record<string, string>; views: Record<string, string> };

const pct = (share: number) => `${(share * 100).toFixed(share > 0 && share < 0.001 ? 3 : 2)} %`;
const mm = (value: number | null, unit = "mm") => (value === null ? null : `${value.toFixed(value < 10 ? 2 : 1)} ${unit}`);

function calibrationText(c: Calibration): string {
  if (c.method === "ruler") return `Ruler, ${c.pxPerMm.toFixed(2)} px/mm`;
  if (c.method === "nominal") return `nominal part size, ${c.pxPerMm.toFixed(2)} px/mm`;
  return "none (no Ruler and no nominal size: no millimetres)";
}

function details(m: DefectMeasure): string {
  const parts = [`${m.count} region${m.count === 1 ? "" : "s"}`];
  const area = mm(m.areaMm2, "mm²");
  if (area) parts.push(area);
  if (m.maxLengthMm !== null) parts.push(`longest ${mm(m.maxLengthMm)}${m.totalLengthMm !== null && m.totalLengthMm !== m.maxLengthMm ? `, total ${mm(m.totalLengthMm)}` : ""}`);
  if (m.maxDiameterMm !== null) parts.push(`largest ⌀ ${mm(m.maxDiameterMm)}`);
  return parts.join(" · ");
}

/**
 * What the measurement engine found, per photo: each class's share of the Surface with its count,
 * area and lengths, each zone's shares, the calibration used and (screens) the pixel-fault class.
 */
export function MeasurementTable({ photos, labels }: { photos: StoredPhotoResult[]; labels: MeasurementLabels }) {
  const name = (key: string, list: Record<string, string>) => list[key] ?? key;
  return (
    <div className="space-y-3" data-testid="measurement-table">
      {photos.map(({ measurement: m, notes }, i) => {
        const classes = Object.entries(m.byDefect);
        const zones = Object.entries(m.byZone);
        return (
          <div key={m.photoId} className="rounded-md border border-gauge-200 p-2 text-sm" data-testid="measured-photo">
            <p className="font-medium">
              Photo {i + 1}: {name(m.viewKey, labels.views)}
            </p>
            <p className="text-xs text-gauge-700" data-testid="calibration">
              Calibration: {calibrationText(m.calibration)}
            </p>
            {classes.length === 0 ? (
              <p className="text-xs text-gauge-700">No defect regions.</p>
            ) : (
              <table className="mt-1 w-full text-xs">
                <caption className="sr-only">Defect classes on photo {i + 1}</caption>
                <thead>
                  <tr className="text-left text-gauge-600">
                    <th scope="col" className="py-0.5 pr-2 font-medium">
                      Class · zone
                    </th>
                    <th scope="col" className="py-0.5 pr-2 text-right font-medium">
                      Share
                    </th>
                    <th scope="col" className="py-0.5 font-medium">
                      Details
                    </th>
                  </tr>
                </thead>
                <tbody>
                  {classes.map(([defect, measure]) => (
                    <tr key={defect} className="border-t border-gauge-100 align-top" data-testid={`measure-${defect}`}>
                      <th scope="row" className="py-0.5 pr-2 text-left font-medium">
                        {name(defect, labels.defects)}
                      </th>
                      <td className="py-0.5 pr-2 text-right tabular-nums">{pct(measure.share)}</td>
                      <td className="py-0.5 tabular-nums">{details(measure)}</td>
                    </tr>
                  ))}
                  {zones.flatMap(([zoneId, zone]) =>
                    Object.entries(zone.byDefect).map(([defect, z]) => (
                      <tr key={`${zoneId}-${defect}`} className="border-t border-gauge-100 align-top text-gauge-800" data-testid={`measure-${defect}-${zoneId}`}>
                        <th scope="row" className="py-0.5 pr-2 text-left font-normal">
                          {name(defect, labels.defects)} · {name(zoneId, labels.zones)}
                        </th>
                        <td className="py-0.5 pr-2 text-right tabular-nums">{zone.zonePx === 0 ? "—" : pct(z.share)}</td>
                        <td className="py-0.5 tabular-nums">{mm(z.areaMm2, "mm²") ?? ""}</td>
                      </tr>
                    )),
                  )}
                </tbody>
              </table>
            )}
            {m.pixelFaults && (
              <p className="mt-1 text-xs" data-testid="pixel-faults">
                Pixel faults: ISO 13406-2 class {m.pixelFaults.isoClass} ({m.pixelFaults.counts.alwaysLit} lit, {m.pixelFaults.counts.alwaysDark} dark, {m.pixelFaults.counts.subPixel} sub-pixel)
              </p>
            )}
            {notes.length > 0 && (
              <details className="mt-1 text-xs text-gauge-700">
                <summary className="cursor-pointer">
                  How it was measured ({notes.length} note{notes.length === 1 ? "" : "s"})
                </summary>
                <ul className="mt-1 list-disc space-y-0.5 pl-4">
                  {notes.map((note, k) => (
                    <li key={k}>{note}</li>
                  ))}
                </ul>
              </details>
            )}
          </div>
        );
      })}
    </div>
  );
}
