import type { Role } from "@/db/schema";

/** What each kind of signature means, in the words shown to the signer and printed beside the signature. */
export const SIGNATURE_MEANINGS = {
  release: "reviewed and approved for release",
  supersede: "reviewed and approved this revision, replacing the earlier one",
  withdraw: "withdrew the report; it is no longer valid",
  concession: "accepted the unit under the client's concession",
  scrap: "declared the unit scrapped",
  reopen: "reopened the unit's disposition",
  "overdue-instrument": "confirmed a capture taken with an instrument past its calibration due date may be reported",
} as const;

export type SigningPurpose = keyof typeof SIGNATURE_MEANINGS;

/** Who may give each signature: quality engineers and lab managers; an overdue confirmation is a quality engineer's. */
export const SIGNING_ROLES: Record<SigningPurpose, readonly Role[]> = {
  release: ["qa", "admin"],
  supersede: ["qa", "admin"],
  withdraw: ["qa", "admin"],
  concession: ["qa", "admin"],
  scrap: ["qa", "admin"],
  reopen: ["qa", "admin"],
  "overdue-instrument": ["qa"],
};

export const ROLE_TITLES: Record<Role, string> = {
  admin: "Lab manager",
  qa: "Quality engineer",
  operator: "Test-bench operator",
  manufacturer: "Client user",
};
