import type { Knex } from "../../db/knex.ts";
import type { CurveConvention } from "../../physics/forecast/curves.ts";

/** Users' uploaded noise curves. Knex in, plain objects out. */

export interface CurveRow {
  id: number;
  owner_id: number;
  name: string;
  convention: CurveConvention;
  space: boolean;
  uploaded_kind: "asd" | "psd";
  frequencies: number[];
  psd: number[];
  created_at: Date;
}

export type CurveSummaryRow = Omit<CurveRow, "frequencies" | "psd"> & { points: number; f_min: number; f_max: number };

export function curvesRepository(db: Knex) {
  return {
    async insert(row: Omit<CurveRow, "id" | "created_at">): Promise<CurveSummaryRow> {
      const [stored] = await db("forecast_curves")
        .insert(row)
        .returning(["id", "owner_id", "name", "convention", "space", "uploaded_kind", "created_at"]);
      return { ...stored, points: row.frequencies.length, f_min: row.frequencies[0]!, f_max: row.frequencies[row.frequencies.length - 1]! };
    },

    async listByOwner(ownerId: number): Promise<CurveSummaryRow[]> {
      return db("forecast_curves")
        .where({ owner_id: ownerId })
        .orderBy("id")
        .select(
          "id",
          "owner_id",
          "name",
          "convention",
          "space",
          "uploaded_kind",
          "created_at",
          db.raw("cardinality(frequencies)::int as points"),
          db.raw("frequencies[1] as f_min"),
          db.raw("frequencies[cardinality(frequencies)] as f_max"),
        );
    },

    async countByOwner(ownerId: number): Promise<number> {
      const [row] = await db("forecast_curves").where({ owner_id: ownerId }).count<{ count: string }[]>("id as count");
      return Number(row?.count ?? 0);
    },

    /** Full rows of the given ids that belong to the owner (others are simply absent). */
    async findOwned(ownerId: number, ids: readonly number[]): Promise<CurveRow[]> {
      if (ids.length === 0) return [];
      return db("forecast_curves").where({ owner_id: ownerId }).whereIn("id", [...ids]).select("*");
    },

    async delete(ownerId: number, id: number): Promise<boolean> {
      const n = await db("forecast_curves").where({ owner_id: ownerId, id }).delete();
      return n > 0;
    },
  };
}
export type CurvesRepository = ReturnType<typeof curvesRepository>;
