export { AccountScreen as default } from "@/components/account/account-screen";
