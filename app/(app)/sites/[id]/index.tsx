export { SiteRoomsScreen as default } from "@/components/site/site-rooms-screen";
