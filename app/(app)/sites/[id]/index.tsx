export { SiteHome as default } from "@/components/site/site-home";
