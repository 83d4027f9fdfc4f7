import { Redirect, Slot } from "expo-router";
import { useSession } from "@/hooks/queries/me";

export default function AuthLayout() {
  const session = useSession();
  if (session.data?.status === "signed-in" && !session.data.offline) return <Redirect href="/" />;
  return <Slot />;
}
