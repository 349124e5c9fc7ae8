import { Router } from "express";
import { z } from "zod";
import { createUserInputSchema, setPasswordInputSchema, updateUserInputSchema } from "../../shared/schemas/auth";
import { requireRole } from "../middleware/require-auth";
import { presentTeamMember } from "../presenters/user.presenter";
import type { UsersService } from "../services/users.service";
import { notFound } from "../errors";
import { requireBody } from "./auth.routes";

/** A numeric route id; anything else is a record nobody can see (404). */
export function parseId(raw: string | undefined, what = "Resource"): number {
  const id = z.coerce.number().int().positive().max(4294967295).safeParse(raw);
  if (!id.success) throw notFound(what);
  return id.data;
}

export function usersRouter(users: UsersService): Router {
  const router = Router();
  router.use(requireRole("owner"));

  router.get("/", async (req, res) => {
    const rows = await users.list(req.user!);
    res.json({ data: rows.map(presentTeamMember) });
  });

  router.post("/", async (req, res) => {
    const input = createUserInputSchema.parse(requireBody(req));
    const user = await users.create(input, req.user!);
    res.status(201).json({ data: presentTeamMember(user) });
  });

  router.patch("/:id", async (req, res) => {
    const id = parseId(req.params.id, "User");
    await users.get(id, req.user!); // 404 before validation for another company's id
    const input = updateUserInputSchema.parse(requireBody(req));
    const user = await users.update(id, input, req.user!);
    res.json({ data: presentTeamMember(user) });
  });

  router.put("/:id/password", async (req, res) => {
    const id = parseId(req.params.id, "User");
    await users.get(id, req.user!);
    const input = setPasswordInputSchema.parse(requireBody(req));
    await users.setPassword(id, input.password, req.user!);
    res.status(204).end();
  });

  return router;
}
