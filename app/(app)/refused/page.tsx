import { forbidden } from "next/navigation";

export const metadata = { title: "Not open to your role" };

/** Where proxy.ts sends a page request the role may not open: 403 with the app's menu (forbidden.tsx). */
export default function RefusedPage(): never {
  forbidden();
}
