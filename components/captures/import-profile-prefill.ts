"use client";

import { headerSignature, type ChannelRole, type SniffedHeader } from "@/lib/analysis";
import type { ImportProfileSettings } from "@/lib/captures/import-profile";

// Pre-fills a file's roles, probe ratios, offsets and time base from its bench's import profile.

export type Prefill = {
  roles: Record<string, ChannelRole>;
  scales: Record<string, string>;
  offsets: Record<string, string>;
  sampleRate: string;
  profileNote: string | null;
};

export function signatureOf(sniffed: SniffedHeader): string {
  return headerSignature(sniffed).signature;
}

/** The profile's settings for the channels this file has; null without a profile (or on any error). */
export async function fetchPrefill(stationId: string, signature: string, channels: string[], roles: Record<string, ChannelRole>): Promise<Prefill | null> {
  const res = await fetch(`/api/import-profiles?${new URLSearchParams({ stationId, signature })}`, { cache: "no-store" }).catch(() => null);
  if (!res?.ok) return null;
  const profile = (await res.json()) as { updatedAt: string; settings: ImportProfileSettings };
  const pick = <T,>(record: Record<string, T>, show: (value: T) => string) =>
    Object.fromEntries(channels.filter((ch) => record[ch] !== undefined).map((ch) => [ch, show(record[ch] as T)]));
  return {
    roles: { ...roles, ...(pick(profile.settings.channelRoles, (r) => r) as Record<string, ChannelRole>) },
    scales: pick(profile.settings.probeScales, String),
    offsets: pick(profile.settings.channelOffsets, String),
    sampleRate: profile.settings.sampleRateHz !== null ? String(profile.settings.sampleRateHz) : "",
    profileNote: `Pre-filled from this bench's import profile for this header (saved ${profile.updatedAt.slice(0, 10)})`,
  };
}
