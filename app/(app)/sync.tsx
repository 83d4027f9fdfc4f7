export { SyncScreen as default } from "@/components/sync/sync-screen";
