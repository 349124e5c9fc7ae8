import { Router } from "express";
import { customerInputSchema, customerListQuerySchema, customerUpdateSchema } from "../../shared/schemas/customer";
import type { AppContext } from "../app";
import { requireRole } from "../middleware/require-auth";
import { presentCustomer } from "../presenters/customer.presenter";
import { CustomersService } from "../services/customers.service";
import { requireBody } from "./auth.routes";
import { parseId } from "./users.routes";

/** /api/customers: owners and estimators (crew 403). */
export function customersRouter(ctx: Pick<AppContext, "sequelize">): Router {
  const customers = new CustomersService(ctx.sequelize);
  const router = Router();
  router.use(requireRole("owner", "estimator"));

  router.get("/", async (req, res) => {
    const query = customerListQuerySchema.parse(req.query);
    const { rows, count } = await customers.list(query, req.user!);
    res.json({ data: rows.map(presentCustomer), meta: { page: query.page, pageSize: query.pageSize, total: count } });
  });

  router.post("/", async (req, res) => {
    const input = customerInputSchema.parse(requireBody(req));
    res.status(201).json({ data: presentCustomer(await customers.create(input, req.user!)) });
  });

  router.get("/:id", async (req, res) => {
    const customer = await customers.get(parseId(req.params.id, "Customer"), req.user!);
    res.json({ data: presentCustomer(customer) });
  });

  router.patch("/:id", async (req, res) => {
    const id = parseId(req.params.id, "Customer");
    await customers.get(id, req.user!); // 404 before validation for another company's id
    const input = customerUpdateSchema.parse(requireBody(req));
    res.json({ data: presentCustomer(await customers.update(id, input, req.user!)) });
  });

  router.post("/:id/archive", async (req, res) => {
    const customer = await customers.setArchived(parseId(req.params.id, "Customer"), true, req.user!);
    res.json({ data: presentCustomer(customer) });
  });

  router.post("/:id/restore", async (req, res) => {
    const customer = await customers.setArchived(parseId(req.params.id, "Customer"), false, req.user!);
    res.json({ data: presentCustomer(customer) });
  });

  return router;
}
