export { InviteScreen as default } from "@/components/auth/invite-screen";
