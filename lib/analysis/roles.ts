import type { ChannelRole } from "./types";
import { readHeaderUnit } from "./units";

/**
 * Role patterns on a header with its unit, spaces, underscores, hyphens and dots removed,
 * lower-cased. "V_AN (V)" → "van", "U L1-L2" → "ul1l2", "I_A (A)" → "ia".
 */
const ROLE_PATTERNS: [ChannelRole, RegExp][] = [
  ["van", /^(v|u|e)(an|a|1n|1|l1n|l1|ph?a)$/],
  ["vbn", /^(v|u|e)(bn|b|2n|2|l2n|l2|ph?b)$/],
  ["vcn", /^(v|u|e)(cn|c|3n|3|l3n|l3|ph?c)$/],
  ["vab", /^(v|u|e)(ab|12|l1l2)$/],
  ["vbc", /^(v|u|e)(bc|23|l2l3)$/],
  ["vca", /^(v|u|e)(ca|31|l3l1)$/],
  ["ia", /^i(a|1|l1)$/],
  ["ib", /^i(b|2|l2)$/],
  ["ic", /^i(c|3|l3)$/],
];

function roleFromName(header: string): ChannelRole | null {
  const key = readHeaderUnit(header).name.toLowerCase().replace(/[\s_.\-]+/g, "");
  for (const [role, pattern] of ROLE_PATTERNS) if (pattern.test(key)) return role;
  return null;
}

/**
 * Roles from header names where they are unambiguous (a role claimed by two columns is
 * dropped); every other channel is a single voltage "v".
 */
export function suggestChannelRoles(channelHeaders: readonly string[]): Record<string, ChannelRole> {
  const found = channelHeaders.map((header) => roleFromName(header));
  const counts = new Map<ChannelRole, number>();
  for (const role of found) if (role) counts.set(role, (counts.get(role) ?? 0) + 1);
  const roles: Record<string, ChannelRole> = {};
  channelHeaders.forEach((header, index) => {
    const role = found[index];
    roles[header] = role && counts.get(role) === 1 ? role : "v";
  });
  return roles;
}
