import { redirect } from "next/navigation";
import { pageUser } from "@/lib/auth/page-guard";

export default async function AdminIndex() {
  await pageUser("/admin");
  redirect("/admin/users");
}
