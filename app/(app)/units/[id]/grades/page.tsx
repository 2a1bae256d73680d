import { redirect } from "next/navigation";

/** Measuring and grading now live on the Bench; old links land on its grade panel. */
export default async function UnitGradesPage(props: PageProps<"/units/[id]/grades">) {
  const { id } = await props.params;
  redirect(`/units/${encodeURIComponent(id)}#grade`);
}
