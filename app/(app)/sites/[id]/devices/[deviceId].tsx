export { DeviceScreen as default } from "@/components/walk/device-screen";
