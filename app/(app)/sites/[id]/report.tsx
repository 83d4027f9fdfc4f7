export { SiteReportScreen as default } from "@/components/site/site-report-screen";
