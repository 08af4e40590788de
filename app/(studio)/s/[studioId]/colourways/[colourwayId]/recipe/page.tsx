import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { RecipeCardView } from "@/components/learning/recipe-card";
import { PrintButton } from "@/components/ui/print-button";
import { StudioSchema, UserSchema } from "@/entities";
import { isUuid } from "@/lib/auth/with-studio";
import { getEm } from "@/lib/db";
import { getColourway } from "@/lib/learning/colourways";
import { scaleColourwayRecipe } from "@/lib/learning/recipe";
import { requireMembership } from "@/lib/pages/studio";
import { recipeQuery } from "@/lib/schemas/colourway";

export const metadata: Metadata = { title: "Recipe card" };

/** The colourway's recipe scaled to ?weight= grams, one printed A4 page (rendered on the server so printing never waits). */
export default async function RecipePage({
  params,
  searchParams,
}: {
  params: Promise<{ studioId: string; colourwayId: string }>;
  searchParams: Promise<{ weight?: string }>;
}) {
  const { studioId, colourwayId } = await params;
  const m = await requireMembership(studioId);
  if (!isUuid(colourwayId)) notFound();
  const parsed = recipeQuery.safeParse({ weight: (await searchParams).weight ?? "100" });
  const weight = parsed.success ? parsed.data.weight : 100;
  const em = await getEm();
  const [studio, reader] = await Promise.all([
    em.findOneOrFail(StudioSchema, { id: studioId }),
    em.findOneOrFail(UserSchema, { id: m.user.id }, { fields: ["unitSystem", "temperatureUnit"] }),
  ]);
  const colourway = await getColourway(em, studio, colourwayId).catch(() => notFound());
  return (
    <>
      <style>{"@page { size: A4; margin: 12mm; }"}</style>
      <div className="no-print mx-auto mb-4 flex max-w-[190mm] flex-wrap items-center gap-3">
        <a href={`/s/${studioId}/colourways/${colourwayId}`} className="inline-flex min-h-11 items-center text-accent">
          ← {colourway.name}
        </a>
        <PrintButton label="Print recipe card" />
        {!parsed.success && <p className="text-caution">That weight was not usable; shown for 100 g.</p>}
      </div>
      <RecipeCardView
        card={scaleColourwayRecipe(colourway, weight)}
        studioName={m.studio.name}
        units={{ system: reader.unitSystem, temperature: reader.temperatureUnit }}
      />
    </>
  );
}
