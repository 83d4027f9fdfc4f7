export { SitesScreen as default } from "@/components/sites/sites-screen";
