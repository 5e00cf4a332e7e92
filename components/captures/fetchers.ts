import type { CaptureCorrection, CaptureRegistration, PartUrl, UploadPlan } from "@/lib/captures/input-schemas";
import type { CaptureStatusView, SpectrumView, WaveformPreview } from "@/lib/dal/captures";

// Typed fetchers for the session handlers under /api/captures. Errors carry the server's message.

export class ApiError extends Error {
  constructor(readonly status: number, message: string) {
    super(message);
  }
}

async function call<T>(url: string, init?: RequestInit): Promise<T> {
  const res = await fetch(url, { ...init, headers: { "Content-Type": "application/json", ...init?.headers }, cache: "no-store" });
  const body: unknown = await res.json().catch(() => ({}));
  if (!res.ok) {
    const message = typeof body === "object" && body && "error" in body ? String((body as { error: unknown }).error) : `Request failed (${res.status})`;
    throw new ApiError(res.status, message);
  }
  return body as T;
}

export type Registered = { capture: CaptureStatusView; duplicate: boolean; upload: UploadPlan | null; settingsDiffer?: Record<string, [unknown, unknown]> | null };

export const captureKeys = {
  status: (id: string) => ["capture", id, "status"] as const,
  plot: (id: string) => ["capture", id, "plot"] as const,
};

export const fetchCaptureStatus = (id: string) => call<CaptureStatusView>(`/api/captures/${id}`);
export const fetchCapturePlot = (id: string) => call<{ preview: WaveformPreview; spectrum: SpectrumView }>(`/api/captures/${id}/plot`);
export const postRegistration = (input: CaptureRegistration) => call<Registered>("/api/captures", { method: "POST", body: JSON.stringify(input) });
export const postComplete = (id: string, parts?: { partNumber: number; etag: string; sha256?: string }[]) =>
  call<CaptureStatusView>(`/api/captures/${id}/complete`, { method: "POST", body: JSON.stringify({ parts }) });
export const postPresignParts = (id: string, parts: { partNumber: number; sha256: string }[]) =>
  call<{ parts: PartUrl[] }>(`/api/captures/${id}/parts`, { method: "POST", body: JSON.stringify({ parts }) });

export const postReanalyse = (id: string) => call<{ queued: number }>(`/api/captures/${id}/reanalyse`, { method: "POST", body: "{}" });

export const postReanalyseRating = (ratingId: string) => call<{ queued: number }>("/api/captures/reanalyse", { method: "POST", body: JSON.stringify({ ratingId }) });

export const isFinalState = (state: CaptureStatusView["state"]) => state === "analysed" || state === "rejected" || state === "failed";

export const patchCapture = (id: string, correction: CaptureCorrection) =>
  call<CaptureStatusView>(`/api/captures/${id}`, { method: "PATCH", body: JSON.stringify(correction) });
