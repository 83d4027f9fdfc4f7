export { NotFoundScreen as default } from "@/components/not-found-screen";
