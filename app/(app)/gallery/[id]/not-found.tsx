import Link from "next/link";

export default function GalleryItemNotFound() {
  return (
    <div className="card max-w-xl space-y-3 p-6" data-testid="gallery-item-not-found">
      <h1 className="text-lg font-semibold">No such gallery item</h1>
      <p className="text-sm text-gauge-700">It does not exist, belongs to another workspace, or is a draft or retired item that only trainers and leads see.</p>
      <Link href="/gallery" className="btn-primary">
        Back to the Gallery
      </Link>
    </div>
  );
}
