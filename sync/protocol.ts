// The sync protocol between a phone's local store and the server, shared by both sides.
//
// Each local store has a random client id, bound to its user on first push. Mutations carry
// consecutive ids; the server skips ids it has applied and refuses gaps, so a retried push takes
// effect exactly once. A pull returns what changed since a cursor: the team's version number,
// bumped under a row lock inside each push transaction.
import * as v from "valibot";
import { ITEM_KINDS } from "../survey/capture";

export const PROTOCOL_VERSION = 1;
export const MAX_BATCH = 500;

const Id = v.pipe(v.string("Ids are text."), v.minLength(1, "An id cannot be empty."), v.maxLength(80, "Ids are at most 80 characters."));
const Fields = v.pipe(
  v.record(v.pipe(v.string(), v.maxLength(60)), v.unknown(), "Fields must be an object."),
  v.check((f) => Object.keys(f).length <= 60, "At most 60 fields per change."),
);

export const ItemPutArgs = v.object({
  itemId: Id,
  siteId: Id,
  kind: v.picklist(ITEM_KINDS, "Kind must be floor, room, device, source or battery."),
  /** Only the fields this change sets; `null` clears a field. */
  fields: Fields,
  /** The item's version the phone had when the change was made (0 for a new item). */
  baseVersion: v.pipe(v.number("The base version is a number."), v.integer("The base version is a whole number."), v.minValue(0, "The base version cannot be negative."), v.maxValue(Number.MAX_SAFE_INTEGER, "The base version is too large.")),
});
export const ItemDeleteArgs = v.object({ itemId: Id, siteId: Id });
export const SiteUpdateArgs = v.object({
  siteId: Id,
  fields: v.partial(v.object({ closetRoomId: v.nullable(Id), units: v.picklist(["metric", "imperial"], "Units are metric or imperial.") })),
});

const MutationId = v.pipe(v.number("Mutation ids are numbers."), v.integer("Mutation ids are whole numbers."), v.minValue(1, "Mutation ids start at 1."), v.maxValue(Number.MAX_SAFE_INTEGER));

export const MutationSchema = v.variant("name", [
  v.object({ id: MutationId, name: v.literal("item.put"), args: ItemPutArgs }),
  v.object({ id: MutationId, name: v.literal("item.delete"), args: ItemDeleteArgs }),
  v.object({ id: MutationId, name: v.literal("site.update"), args: SiteUpdateArgs }),
], "Each change needs a name: item.put, item.delete or site.update.");
export type Mutation = v.InferOutput<typeof MutationSchema>;
export type MutationName = Mutation["name"];
export type MutationArgs<N extends MutationName> = Extract<Mutation, { name: N }>["args"];

const ClientId = v.pipe(v.string(), v.uuid("The client id must be a UUID."));

export const PushRequestSchema = v.object({
  clientId: ClientId,
  mutations: v.pipe(v.array(MutationSchema), v.maxLength(MAX_BATCH, `Send at most ${MAX_BATCH} changes per push.`)),
});
export type PushRequest = v.InferOutput<typeof PushRequestSchema>;
export interface PushResponse {
  lastMutationId: number;
}

export const PullRequestSchema = v.object({
  clientId: ClientId,
  cursor: v.pipe(v.number("The cursor is a number."), v.integer("The cursor is a whole number."), v.minValue(0, "The cursor cannot be negative."), v.maxValue(Number.MAX_SAFE_INTEGER, "The cursor is too large.")),
  /** Sites the phone already holds; any other visible site comes back whole. */
  knownSiteIds: v.pipe(v.array(Id), v.maxLength(1000)),
});
export type PullRequest = v.InferOutput<typeof PullRequestSchema>;

export interface SiteRecord {
  id: string;
  name: string;
  address: string;
  status: string;
  units: "metric" | "imperial";
  closetRoomId: string | null;
  version: number;
}

export interface ItemRecord {
  id: string;
  siteId: string;
  kind: (typeof ITEM_KINDS)[number];
  data: Record<string, unknown>;
  deleted: boolean;
  version: number;
}

export interface PhotoRecord {
  id: string;
  siteId: string;
  itemId: string | null;
  label: string;
  mime: string;
  size: number;
  version: number;
}

/** A change the server refused for a domain reason; the queue moves on and the phone shows why. */
export interface Rejection {
  mutationId: number;
  code: string;
  message: string;
}

/** Two people set the same field: the later arrival won; the lost value is kept and shown once. */
export interface ConflictNote {
  id: string;
  itemId: string;
  siteId: string;
  field: string;
  lostValue: unknown;
  keptValue: unknown;
  lostBy: string | null;
  keptBy: string | null;
  version: number;
}

export interface PullResponse {
  cursor: number;
  lastMutationId: number;
  sites: SiteRecord[];
  removedSiteIds: string[];
  items: ItemRecord[];
  photos: PhotoRecord[];
  rejections: Rejection[];
  conflicts: ConflictNote[];
}
