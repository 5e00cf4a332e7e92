import { CaptureRejection } from "@/lib/analysis";

/** The CaptureRejection that `run` throws; fails the test when it throws nothing or something else. */
export function rejectionOf(run: () => unknown): CaptureRejection {
  try {
    run();
  } catch (error) {
    if (error instanceof CaptureRejection) return error;
    throw error;
  }
  throw new Error("expected a CaptureRejection");
}
