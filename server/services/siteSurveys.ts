import { QueryTypes, type Sequelize } from 'sequelize';
import type { SurveyRow } from '../../shared/radio/surveyCsv';

export interface SiteSurveyRow {
  id: number;
  nodeId: number;
  fileName: string | null;
  rowCount: number;
  rows: unknown[];
  createdAt: Date;
  uploadedBy: number | null;
}
const COLS = 'id, node_id AS "nodeId", file_name AS "fileName", row_count AS "rowCount", rows, uploaded_by AS "uploadedBy", created_at AS "createdAt"';

/** The node's 20 newest surveys. */
export async function surveysOf(sequelize: Sequelize, nodeId: number): Promise<SiteSurveyRow[]> {
  return sequelize.query<SiteSurveyRow>(`SELECT ${COLS} FROM site_surveys WHERE node_id = $1 ORDER BY created_at DESC, id DESC LIMIT 20`, {
    bind: [nodeId],
    type: QueryTypes.SELECT,
  });
}

/** Stores a parsed survey; the file name is already reduced to a display name. */
export async function saveSurvey(
  sequelize: Sequelize,
  survey: { nodeId: number; fileName: string | null; uploadedBy: number; rows: SurveyRow[] },
): Promise<SiteSurveyRow> {
  const [row] = await sequelize.query<SiteSurveyRow>(
    `INSERT INTO site_surveys (node_id, file_name, uploaded_by, row_count, rows) VALUES ($1, $2, $3, $4, $5::jsonb) RETURNING ${COLS}`,
    { bind: [survey.nodeId, survey.fileName, survey.uploadedBy, survey.rows.length, JSON.stringify(survey.rows)], type: QueryTypes.SELECT },
  );
  return row;
}
