// GET /api/imports/formats for the imports page's tests: the server lists every kind, here without columns,
// since these tests check the page's steps, not the column list.
import { formatsResponseSchema } from "../../shared/import/api";
import { answer } from "./testServer";

export const formatsWithoutColumns = answer(formatsResponseSchema, { formats: { classes: [], attempts: [], compressions: [], equipment: [] } });
