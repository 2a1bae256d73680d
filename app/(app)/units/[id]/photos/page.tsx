import { redirect } from "next/navigation";

/** The unit's photos now live on the Bench; old links land on its photo strip. */
export default async function UnitPhotosPage(props: PageProps<"/units/[id]/photos">) {
  const { id } = await props.params;
  redirect(`/units/${encodeURIComponent(id)}#photos`);
}
