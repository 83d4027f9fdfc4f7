export { RoomScreen as default } from "@/components/walk/room-screen";
