export { SignInScreen as default } from "@/components/auth/sign-in-screen";
