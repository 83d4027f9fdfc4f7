export { SitePlanScreen as default } from "@/components/site/site-plan-screen";
