import "server-only";
import { CHECK_IDS, ratingSchema } from "@/lib/analysis";
import type { Actor } from "./actor";
import { getPlanView } from "./rating-plans";
import { countAffectedCaptures, getProfileHistory } from "./rating-profiles";
import { ratingJson, requireLabRating } from "./ratings";

/** Everything /ratings/[id] shows: nameplate, profile in force, version history, plan, and what a re-judge would touch. */
export async function getRatingPageView(actor: Actor, ratingId: string) {
  const { row } = await requireLabRating(actor, ratingId);
  const [versions, plan, affected] = await Promise.all([getProfileHistory(actor, ratingId), getPlanView(actor, ratingId), countAffectedCaptures(actor, ratingId)]);
  const inForce = versions[0] ?? null;
  const nameplate = ratingSchema.safeParse(row.rating.nameplate);
  return {
    rating: ratingJson(row),
    nameplate: nameplate.success ? nameplate.data : null,
    inForce,
    versions,
    plan,
    judgedChecks: inForce?.profile ? CHECK_IDS.filter((id) => inForce.profile?.checks[id].required) : [],
    affectedCaptures: affected,
    canEdit: actor.role === "admin" || actor.role === "qa",
  };
}
