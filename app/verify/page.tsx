import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { TextInput } from "@/components/ui/field";
import { Button } from "@/components/ui/button";
import { VerifyFrame } from "./[number]/_components/verify-frame";

export const metadata: Metadata = { title: "Verify a test report" };

export default async function VerifyStart({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const { number } = await searchParams;
  if (typeof number === "string" && number.trim()) redirect(`/verify/${encodeURIComponent(number.trim())}`);
  return (
    <VerifyFrame>
      <form method="get" className="rounded-lg bg-white p-6 shadow-sm ring-1 ring-ink-200">
        <h1 className="text-lg font-semibold">Verify a test report</h1>
        <label className="mt-4 block text-sm font-medium" htmlFor="number">Report number (top of every page)</label>
        <div className="mt-1 flex gap-2">
          <TextInput id="number" name="number" maxLength={64} required />
          <Button type="submit">Look up</Button>
        </div>
      </form>
    </VerifyFrame>
  );
}
