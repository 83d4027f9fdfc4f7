import { and, eq } from "drizzle-orm";
import { Router, type RequestHandler } from "express";
import multer from "multer";
import * as v from "valibot";
import { photos, teams } from "../../db/schema";
import { actorOf } from "../auth/actor";
import type { AppContext } from "../context";
import { HttpError, notFound, param, parseInput } from "../errors";
import { siteFor } from "../services/site-access";
import { IMAGE_EXTENSION, sniffImage } from "../storage/sniff-image";

const PhotoFieldsSchema = v.object({
  id: v.pipe(v.string(), v.uuid("The photo id must be a UUID.")),
  siteId: v.pipe(v.string("Say which site the photo belongs to."), v.nonEmpty("Say which site the photo belongs to."), v.maxLength(80)),
  itemId: v.optional(v.pipe(v.string(), v.maxLength(80))),
  label: v.optional(v.pipe(v.string(), v.maxLength(120, "Keep the label under 120 characters.")), ""),
});

export function photosRouter({ db, objects, config }: AppContext, router: Router = Router()) {
  const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: config.maxPhotoBytes, files: 1, fields: 10, fieldSize: 1024 } });
  const receive: RequestHandler = (req, res, next) =>
    upload.single("file")(req, res, (err: unknown) => {
      if (err instanceof multer.MulterError) {
        if (err.code === "LIMIT_FILE_SIZE") return next(new HttpError(413, "photo_too_large", `The photo is larger than ${Math.round(config.maxPhotoBytes / 1024 / 1024)} MB. Take it at a lower resolution.`));
        return next(new HttpError(400, "invalid_upload", `Send one photo in the field "file" (${err.code.toLowerCase().replace(/_/g, " ")}).`));
      }
      next(err);
    });

  router.post("/photos", receive, async (req, res) => {
    const actor = actorOf(res);
    const fields = parseInput(PhotoFieldsSchema, req.body, "photo");
    if (!req.file) throw new HttpError(400, "invalid_upload", 'Send the photo in the field "file".', { file: ["No photo was attached."] });
    const site = await siteFor(db, actor, fields.siteId, "site:capture");
    const type = sniffImage(req.file.buffer);
    if (!type) throw new HttpError(415, "not_an_image", "That file is not a photo Dropwise can keep (JPEG, PNG, WebP or HEIC).", { file: ["Not a JPEG, PNG, WebP or HEIC image."] });
    const [existing] = await db.select({ id: photos.id, siteId: photos.siteId }).from(photos).where(eq(photos.id, fields.id));
    if (existing) {
      // A retried upload (the first answer was lost): same photo, nothing new.
      if (existing.siteId !== site.id) throw new HttpError(409, "id_taken", "Another photo already uses this id.");
      res.json({ photo: { id: existing.id } });
      return;
    }
    const objectKey = `teams/${actor.teamId}/sites/${site.id}/${fields.id}.${IMAGE_EXTENSION[type]}`;
    // Store the bytes first: a row never points at a missing object (an orphaned object is harmless).
    await objects.put(objectKey, req.file.buffer, type);
    await db.transaction(async (tx) => {
      const [team] = await tx.select({ version: teams.version }).from(teams).where(eq(teams.id, actor.teamId)).for("update");
      const version = team.version + 1;
      await tx
        .insert(photos)
        .values({ id: fields.id, teamId: actor.teamId, siteId: site.id, itemId: fields.itemId ?? null, label: fields.label, mime: type, size: req.file!.size, objectKey, uploadedBy: actor.userId, version })
        .onConflictDoNothing();
      await tx.update(teams).set({ version }).where(eq(teams.id, actor.teamId));
    });
    res.status(201).json({ photo: { id: fields.id, mime: type, size: req.file.size } });
  });

  router.get("/photos/:photoId", async (req, res) => {
    const actor = actorOf(res);
    const [photo] = await db.select().from(photos).where(and(eq(photos.id, param(req, "photoId")), eq(photos.teamId, actor.teamId)));
    if (!photo) throw notFound("That photo");
    await siteFor(db, actor, photo.siteId, "site:read");
    const object = await objects.get(photo.objectKey);
    if (!object) throw notFound("That photo's file");
    res.setHeader("Content-Type", photo.mime);
    res.setHeader("Content-Length", String(object.size));
    res.setHeader("Cache-Control", "private, max-age=86400, immutable");
    res.setHeader("X-Content-Type-Options", "nosniff");
    object.body.pipe(res);
  });

  return router;
}
