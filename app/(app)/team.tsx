export { TeamScreen as default } from "@/components/team/team-screen";
