//! TypeScript declarations of the facade's plain-object inputs and outputs (wasm32 only), written into
//! `sunlot.d.ts` beside the generated signatures. Units are in the names; times are RFC 3339 strings
//! (local wall times `YYYY-MM-DDTHH:MM` where the name says `localTime`).

use wasm_bindgen::prelude::*;

#[wasm_bindgen(typescript_custom_section)]
const TYPES: &'static str = r#"
/** A site file (JSON) or a GeoJSON FeatureCollection, as text. */
export type SiteText = string;
export type Massing = "existing" | "withProposed";
export interface SolarPositionInput { latitudeDeg: number; longitudeDeg: number; elevationM?: number;
  time?: string; localTime?: string; zone?: string; fold?: "earlier" | "later"; pressureHpa?: number;
  temperatureC?: number; refraction?: boolean; deltaTS?: number; }
export interface SolarPosition { time: string; zone: string; zenithDeg: number; altitudeDeg: number;
  azimuthDeg: number; altitudeUnrefractedDeg: number; declinationDeg: number; hourAngleDeg: number;
  rightAscensionDeg: number; equationOfTimeMin: number; earthSunDistanceAu: number; deltaTS: number; sunUp: boolean; }
export interface DayEventsInput { latitudeDeg: number; longitudeDeg: number; elevationM?: number; date: string; zone?: string; }
export interface DayEvents { date: string; zone: string; sun: "risesAndSets" | "alwaysUp" | "alwaysDown";
  sunrise: string | null; solarNoon: string; sunset: string | null; dayLengthH: number; noonAltitudeDeg: number;
  civilDawn: string | null; civilDusk: string | null; }
export interface SeasonInstants { year: number; marchEquinox: string; juneSolstice: string;
  septemberEquinox: string; decemberSolstice: string; }
export interface ClearSkyInput { zenithDeg: number; dayOfYear: number; atmosphere?: Record<string, number>; }
export interface ClearSky { airMass: number; extraterrestrialWM2: number; dniWM2: number; dhiWM2: number; ghiWM2: number; }
export interface SiteSummary { name: string; fromGeojson: boolean; zone: string; latitudeDeg: number; longitudeDeg: number;
  areas: { id: string; name: string; kind: AreaKind; status: Status }[];
  volumes: { id: string; status: Status; baseM: number; topM: number }[];
  windows: { id: string; name: string; status: Status; xM: number; yM: number; zM: number; facingDeg: number }[];
  assumptions: string[]; siteJson: string; }
export interface FootprintOptions { zone: string; storeyHeightM?: number; defaultHeightM?: number; name?: string; }
export interface SiteTextKind { kind: "site" | "geojson" | "footprints" | "unknown"; suggestedZone?: string; longitudeDeg?: number; }
export interface WindowLightInput { site: SiteText; id?: string; xM?: number; yM?: number; zM?: number; facingDeg?: number;
  date: string; to?: string; stepMin?: number; azimuthStepDeg?: number; }
export interface WindowLightFigures { vscPct: number; sunH: number; openSunH: number; dayH: number; }
export interface WindowLight { facingDeg: number; existing: WindowLightFigures; withProposed: WindowLightFigures; }
/** Row-major from the bottom row; cell (c, r) is centred at originXM + (col0 + c + 0.5)·cellM, originYM + (row0 + r + 0.5)·cellM. */
export interface GridGeometry { cols: number; rows: number; originXM: number; originYM: number; col0: number; row0: number; cellM: number; }
export interface MapInput { site: SiteText; areas?: string[]; cellM?: number; date: string; to?: string;
  window?: string; stepMin?: number; planeM?: number; massing?: Massing; maxCells?: number; }
export interface MapFigures { cells: number; min: number; mean: number; max: number; }
export interface SunHoursMap { grid: GridGeometry; hours: Float64Array; openHours: number; steps: number; period: string; stats: MapFigures | null; }
export interface CompareMap { grid: GridGeometry; openHours: number; period: string; stats: MapFigures | null; before: Float64Array; after: Float64Array;
  lostH: Float64Array; ratio: Float64Array; }
export interface InsolationInput extends MapInput { aod500?: number; skyStepDeg?: number; }
export interface InsolationMap { grid: GridGeometry; period: string; stats: MapFigures | null; totalKwhM2: Float64Array; beamKwhM2: Float64Array;
  diffuseKwhM2: Float64Array; skyView: Float64Array; sunHours: Float64Array;
  open: { totalKwhM2: number; beamKwhM2: number; diffuseKwhM2: number; sunHours: number }; }
export interface CheckInput { site: SiteText; preset?: string; rule?: object; year: number; cellM?: number; stepMin?: number;
  azimuthStepDeg?: number; }
export type Status = "existing" | "proposed";
export type AreaKind = "lot" | "garden" | "terrace" | "amenity" | "other";
/** An area rule in the rule-file format (snake_case keys, as `checkRule` takes it in `rule`). */
export interface AreaRuleFile { id: string; title: string; source: string; month: number; day: number;
  from: string | null; to: string | null; min_hours: number; min_share: number; min_ratio: number | null;
  combine: "either" | "both"; area_kinds: AreaKind[]; area_ids: string[]; }
/** A window rule in the rule-file format (snake_case keys, as `checkWindows` takes it in `rule`). */
export type WindowRuleFile = { id: string; title: string; source: string; from_memory: boolean; window_ids: string[];
  statuses: Status[] } & (
  | { test: "window_sky"; min_vsc_pct: number; min_ratio: number | null }
  | { test: "window_sun_day"; month: number; day: number; from: string | null; to: string | null; min_hours: number;
      min_altitude_deg: number; min_share_of_windows: number; date_hemisphere: "north" | "south" | null }
  | { test: "window_sun_year"; annual_min_share: number; winter_min_share: number; min_ratio: number;
      max_annual_loss: number; facing_within_deg: number });
export interface AreaCheck { id: string; name: string; areaM2: number; beforeShare: number; afterShare: number; beforeM2: number;
  afterM2: number; ratio: number | null; shareTest: boolean; shareMargin: number; ratioTest: boolean | null;
  ratioMargin: number | null; passes: boolean; shareError: number; nearThreshold: boolean; meanBeforeH: number; meanAfterH: number; }
export interface CheckReport { rule: AreaRuleFile; date: string; cellM: number; stepMin: number; allPass: boolean; caution: string;
  areas: AreaCheck[]; }
export interface WindowReport { rule: WindowRuleFile; year: number; stepMin: number; sharePassing: number | null; passes: boolean;
  cautions: string[]; windows: { id: string; name: string; status: Status; facingDeg: number;
    figures: { name: string; before: number | null; after: number }[]; passes: boolean | null; reason: string }[]; }
export interface MapKindInfo { id: string; title: string; label: string; unit: string; column: string; menu: string | null;
  span: "day" | "year"; cellM: number; stepMin: number; parts: boolean; }
export interface KindInput { kind: string; site: SiteText; date: string; part?: { index: number; of: number }; }
export interface KindMap { kind: string; title: string; label: string; unit: string; column: string; caption: string;
  grid: GridGeometry; values: Float64Array; rangeTop: number; stats: MapFigures | null; openValue: number; }
export interface JoinInput { kind: string; site: SiteText; date: string; openValue?: number; }
export interface FacadeInput { site: SiteText; volume: string; date: string; to?: string; window?: string; stepMin?: number;
  cellM?: number; massing?: Massing; show?: "hours" | "beam" | "insolation" | "lost"; }
export interface FacadeMap { caution: string; faces: { number: number; facingDeg: number; compass: string; startM: [number, number];
    endM: [number, number]; baseM: number; topM: number; cols: number; rows: number; sunHours: number[]; beamKwhM2: number[]; diffuseKwhM2: number[];
    windows: { id: string; alongM: number; zM: number; widthM: number; heightM: number }[] }[]; }
export type RulePreset = { id: string; summary: string } & ({ kind: "area"; rule: AreaRuleFile } | { kind: "window"; rule: WindowRuleFile });
export interface EnvelopeInput { site: SiteText; lot: string; protect?: string[]; date: string; to?: string; window?: string;
  stepMin?: number; cellM?: number; maxHeightM?: number; heightStepM?: number; }
export interface Envelope { grid: GridGeometry; heightM: Float64Array; steps: number; period: string; stats: MapFigures | null; }
export interface PointInput { site: SiteText; xM: number; yM: number; zM?: number; massing?: Massing; }
export interface TimelineInput extends PointInput { date: string; }
export interface Timeline { intervals: { from: string; to: string; sunlit: boolean; by: string | null }[]; sunHours: number; dayHours: number; }
export interface YearProfileInput extends PointInput { year: number; stepMin?: number; }
export interface YearProfile { year: number; skyView: number;
  months: { month: number; sunHours: number; openHours: number; kwhM2: number; openKwhM2: number }[]; }
export interface SkyViewInput extends PointInput { skyStepDeg?: number; }
export interface ShadowTableInput { site: SiteText; date: string; stepMin?: number; }
export interface ShadowTableRow { time: string; altitudeDeg: number; azimuthDeg: number; shadowLengthMPerM: number;
  shadowAzimuthDeg: number; tipsM: Record<string, number>; }
/** CSS hex colours #rrggbb. */
export interface Palette { ink?: string; paper?: string; proposed?: string; }
export interface MassingViewInput { localTime: string; fromDeg: number; elevationDeg: number; perspectiveM?: number;
  palette?: Palette; }
export interface PlanInput { site: SiteText; localTime: string; view?: { xM: number; yM: number; widthM: number }; palette?: Palette; }
export interface PlanFrame { xAtLeftM: number; yAtTopM: number; pxPerM: number; box: [number, number, number, number]; }
export interface SkyInput { site: SiteText; year: number; localTime?: string; dates?: string[]; xM?: number; yM?: number;
  zM?: number; massing?: Massing; projection?: "stereographic" | "equidistant" | "rectangular"; palette?: Palette; }
export interface MapFigureInput extends MapInput { show?: "hours" | "lost"; palette?: Palette; }
export interface LayerInput { grid: GridGeometry; label: string; unit: string; rangeLo?: number; rangeHi?: number; }
export interface LayerFigureInput { site: SiteText; title: string; subtitle?: string; palette?: Palette; }
export interface MapGeojsonInput { site: SiteText; grid: GridGeometry; name: string; title?: string; period?: string; }
export interface UnderlayInput { imageA: [number, number]; imageB: [number, number]; planA: [number, number];
  distanceM: number; bearingDeg?: number; }
export interface Placement { a: number; b: number; c: number; d: number; e: number; f: number; }
/** Called with the fraction done; return false to cancel (the call then throws Error("cancelled")). */
export type Progress = (fraction: number) => boolean;
"#;
