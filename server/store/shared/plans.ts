/** area_plans and spot_positions: what both store implementations share (row shape, mapping, the plan to store). */
import type { PlanInfo, Reading } from '../../../core/schemas';

export interface PlanRow {
  area_id: string;
  content_type: string;
  size: number;
  width: number | null;
  height: number | null;
  sha256: string;
  uploaded_at: string;
}

export interface PlanToStore {
  contentType: PlanInfo['contentType'];
  bytes: Buffer;
  width: number | null;
  height: number | null;
  sha256: string;
}

export function infoFromRow(r: PlanRow): PlanInfo {
  return {
    areaId: r.area_id, contentType: r.content_type as PlanInfo['contentType'], bytes: r.size, width: r.width, height: r.height,
    sha256: r.sha256, uploadedAt: r.uploaded_at,
  };
}


export interface PinData {
  spotId: string;
  code: string;
  name: string;
  position: { x: number; y: number } | null;
  latest: Reading | null;
}
