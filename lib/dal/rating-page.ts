import "server-only";
import { CHECK_IDS, ratingSchema } from "@/lib/analysis";
import type { Actor } from "./actor";
import { getPlanView } from "./rating-plans";
import { countAffectedCaptures, getProfileHistory } from "./rating-profiles";
import { ratingJson, requireLabRating } from "./ratings";

/**
 * Everything /ratings/[id] shows: nameplate, profile in force, version history, plan and, when the page
 * offers a re-judge (`withAffected`, right after a change), how many captures it would touch: a rating
 * can have hundreds of thousands, so they are not counted on every view.
 */
export async function getRatingPageView(actor: Actor, ratingId: string, options: { withAffected?: boolean } = {}) {
  const { row } = await requireLabRating(actor, ratingId);
  const canEdit = actor.role === "admin" || actor.role === "qa";
  const [versions, plan, affected] = await Promise.all([
    getProfileHistory(actor, ratingId), getPlanView(actor, ratingId), options.withAffected && canEdit ? countAffectedCaptures(actor, ratingId) : 0,
  ]);
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
    canEdit,
  };
}
