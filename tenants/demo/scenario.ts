/**
 * The demo lab: Fernhollow Field Station, a fictional research station of our own invention
 * (glasshouse trials, soil plots with drip irrigation, a cold room for samples, a water bath
 * for enzyme assays and a gauge on the brook behind the station). Ninety days of readings are
 * generated from a seed so that every diagnostic in Lagbook has something to show:
 *
 * - daily and weekly cycles (glasshouse air temperature, light, CO₂ with weekday work);
 * - slow trends (the season warming the glasshouse; a drifting cold-room sensor);
 * - persistence where one reading carries into the next (the water bath: AR(1));
 * - short-lived disturbances that die out (cold-room door openings: an MA-like response);
 * - a channel answering another with a lag (soil moisture after irrigation pulses);
 * - a logger that went silent (the brook gauge, nine days before the end);
 * - a sensor that drifted out of its valid range (cold room probe, last ten days);
 * - a few rows that could not be stored (quarantined with their reasons).
 */
export interface DemoChannel {
  key: string;
  label: string;
  unit: string;
  quantity: string;
  validMin?: number;
  validMax?: number;
  seasonalPeriodHint?: number;
  /** Name of the signal model in generate.ts. */
  model: string;
}

export interface DemoLogger {
  name: string;
  serial: string;
  site: string;
  timezone: string;
  intervalS: number;
  /** Days before the end at which the logger stopped reporting (0: reports to the end). */
  silentForDays?: number;
  channels: DemoChannel[];
}

export const DEMO_SEED = 20261202;
export const DEMO_DAYS = 90;

export const DEMO_LAB = {
  slug: 'fernhollow-field-station',
  name: 'Fernhollow Field Station',
  /** Dev accounts (tenants/demo/people.ts) and their roles here. */
  members: [
    { email: 'odalys.brennick@fernhollow.example', role: 'admin' },
    { email: 'tobiah.quarrie@fernhollow.example', role: 'technician' },
    { email: 'maren.olowe@fernhollow.example', role: 'scientist' },
    { email: 'ilse.varga-moss@tarnbeck-institute.example', role: 'guest' },
  ],
} as const;

export const DEMO_LOGGERS: DemoLogger[] = [
  {
    name: 'Glasshouse 2 climate',
    serial: 'FH-GH2-0117',
    site: 'Glasshouse 2, bench row C',
    timezone: 'Europe/Oslo',
    intervalS: 300,
    channels: [
      {
        key: 'air_t',
        label: 'Air temperature',
        unit: '°C',
        quantity: 'temperature',
        validMin: -5,
        validMax: 45,
        seasonalPeriodHint: 288,
        model: 'glasshouse-air',
      },
      { key: 'rh', label: 'Relative humidity', unit: '%', quantity: 'humidity', validMin: 0, validMax: 100, seasonalPeriodHint: 288, model: 'glasshouse-rh' },
      {
        key: 'par',
        label: 'Photosynthetic light (PAR)',
        unit: 'µmol m⁻² s⁻¹',
        quantity: 'light',
        validMin: 0,
        validMax: 2500,
        seasonalPeriodHint: 288,
        model: 'glasshouse-par',
      },
      { key: 'co2', label: 'CO₂', unit: 'ppm', quantity: 'co2', validMin: 300, validMax: 2000, seasonalPeriodHint: 288, model: 'glasshouse-co2' },
    ],
  },
  {
    name: 'North plot soil station',
    serial: 'FH-SOIL-N-04',
    site: 'North plot, drip line 3',
    timezone: 'Europe/Oslo',
    intervalS: 300,
    channels: [
      { key: 'irrigation', label: 'Drip irrigation flow', unit: 'L/min', quantity: 'flow', validMin: 0, validMax: 50, model: 'irrigation' },
      { key: 'soil_moisture', label: 'Soil moisture, 10 cm', unit: '% vol', quantity: 'soil moisture', validMin: 0, validMax: 60, model: 'soil-moisture' },
      {
        key: 'soil_t',
        label: 'Soil temperature, 10 cm',
        unit: '°C',
        quantity: 'temperature',
        validMin: -10,
        validMax: 40,
        seasonalPeriodHint: 288,
        model: 'soil-temperature',
      },
    ],
  },
  {
    name: 'Cold room 3',
    serial: 'FH-CR3-22',
    site: 'Main building, basement',
    timezone: 'Europe/Oslo',
    intervalS: 120,
    channels: [
      { key: 'air_t', label: 'Cold room air temperature', unit: '°C', quantity: 'temperature', validMin: 2, validMax: 8, model: 'cold-room-air' },
      { key: 'door', label: 'Door open time', unit: 's per interval', quantity: 'door', validMin: 0, validMax: 120, model: 'cold-room-door' },
    ],
  },
  {
    name: 'Water bath B',
    serial: 'FH-WB-B-09',
    site: 'Lab 1.14, enzyme bench',
    timezone: 'Europe/Oslo',
    intervalS: 300,
    channels: [{ key: 'bath_t', label: 'Bath temperature', unit: '°C', quantity: 'temperature', validMin: 35, validMax: 39, model: 'water-bath' }],
  },
  {
    name: 'Fern Brook gauge',
    serial: 'FH-BRK-01',
    site: 'Fern Brook, footbridge',
    timezone: 'Europe/Oslo',
    intervalS: 300,
    silentForDays: 9,
    channels: [
      { key: 'level', label: 'Water level', unit: 'cm', quantity: 'water level', validMin: 0, validMax: 250, model: 'brook-level' },
      {
        key: 'do',
        label: 'Dissolved oxygen',
        unit: 'mg/L',
        quantity: 'dissolved oxygen',
        validMin: 0,
        validMax: 20,
        seasonalPeriodHint: 288,
        model: 'brook-oxygen',
      },
    ],
  },
];

/** Rows of a "firmware hiccup" on the soil station that Lagbook quarantines, with their reasons. */
export const DEMO_BAD_ROWS = [
  { channel: 'soil_moisture', ts: 'NaN', value: 21.4 },
  { channel: 'soil_moisture', ts: '2026-13-40T25:00:00Z', value: 21.5 },
  { channel: 'soil_moistre', ts: null, value: 21.6 },
  { channel: 'soil_t', ts: null, value: 'ERR' },
  { channel: 'soil_t', ts: null, value: null },
];
