/**
 * A numbered series of synthetic part photos with planted scratches, cracks and stains and the
 * regions an inspector would mark for them (photo-art.ts): the data the learned-suggestion unit
 * test and benchmark train and score on. Photo `index` is the same on every run. Parts and views
 * rotate through six dark and light housings so the model must learn the marks, not one part.
 */
import { renderAnnotatedPartPhoto, type AnnotatedPartPhoto, type PlantedDefect } from "./photo-art";

const PARTS = [
  ["rear-camera", "front"],
  ["battery", "back"],
  ["back-housing", "front"],
  ["back-housing", "back"],
  ["loudspeaker", "back"],
  ["display", "back"],
] as const;

/** Every photo has a scratch; 4 in 5 a stain; 3 in 5 a crack; 1 in 5 a second scratch. */
export function plantedOn(index: number): PlantedDefect[] {
  const turn = (index * 7) % 5;
  const defects: PlantedDefect[] = ["scratch"];
  if (turn !== 0) defects.push("stain");
  if (turn % 2 === 0) defects.push("crack");
  if (turn === 3) defects.push("scratch");
  return defects;
}

export function renderDefectPhoto(index: number, width = 1280): Promise<AnnotatedPartPhoto> {
  const [kind, viewKey] = PARTS[index % PARTS.length];
  return renderAnnotatedPartPhoto({ kind, viewKey, defects: plantedOn(index), seed: 1000 + index * 31, width, height: Math.round((width * 3) / 4) });
}

/** Photos `first` … `first + count − 1`, rendered two at a time (sharp runs each on the thread pool). */
export async function renderDefectPhotos(first: number, count: number, width?: number): Promise<AnnotatedPartPhoto[]> {
  const photos: AnnotatedPartPhoto[] = [];
  for (let k = 0; k < count; k += 2) {
    photos.push(...(await Promise.all([first + k, first + k + 1].filter((i) => i < first + count).map((i) => renderDefectPhoto(i, width)))));
  }
  return photos;
}
