import Link from "next/link";
import { Logo } from "@/components/ui/Logo";

/** Also what a role sees for a page it may not open, and for another organisation's rows. */
export default function NotFound() {
  return (
    <div className="grid min-h-screen place-items-center px-6">
      <div className="max-w-md text-center">
        <Logo wordmark={false} size={40} />
        <h1 data-testid="not-found" className="mt-4 text-[22px] font-bold">
          Nothing here
        </h1>
        <p className="mt-2 text-[14px] text-steel-500">This page does not exist, or your role may not open it.</p>
        <Link href="/dashboard" className="mt-5 inline-block text-[14px] font-semibold underline decoration-lamp-500 underline-offset-4">
          Back to the overview
        </Link>
      </div>
    </div>
  );
}
