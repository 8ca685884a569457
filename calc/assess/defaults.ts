/**
 * Defaults of the assessment, each a named constant with its source. `assess` lists every default it
 * used among the result's assumptions, so a report prints them.
 */
import type { DriveClass } from '../drives/losses.js';

/** Hours in a year [h]; a duty profile or hoursPerYear may not exceed it. */
export const MAX_HOURS_PER_YEAR = 8760;

/** Discount rate [%/a]: typical hurdle rate of industrial energy-efficiency projects (common practice, no source). */
export const DEFAULT_DISCOUNT_RATE_PCT = 8;

/** Yearly escalation of energy prices [%/a] (common practice, no source). */
export const DEFAULT_ENERGY_ESCALATION_PCT = 2;

/**
 * Life of each option [a]: a new induction motor 20 years, a rewound or kept motor 10 more years, a
 * permanent-magnet motor with its drive and a drive added for speed control 15 years (electronics);
 * an option with an added drive lives as long as the shorter of the two (common practice, no source).
 */
export const DEFAULT_OPTION_LIFE_YEARS = Object.freeze({ keep: 10, rewind: 10, ie3: 20, ie4: 20, ie5: 20, bldc: 15, vsd: 15 });

/** Running hours when neither the motor, the site nor the assumptions give them [h/a]: two shifts (common practice). */
export const DEFAULT_HOURS_PER_YEAR = 4000;

/**
 * Load of a motor (for a fan or pump: at design flow) when not given [-]: most motors run at 50–100 %
 * of rated load, typically 60–80 % (US DOE, "Determining Electric Motor Load and Efficiency", 2014).
 */
export const DEFAULT_LOAD_FACTOR = 0.75;

/** Grid CO2 factor when the site gives none [kg/kWh] (order of a European grid average; value from memory). */
export const DEFAULT_GRID_CO2_KG_PER_KWH = 0.4;

/** IEC 61800-9-2 class of a drive bought with a retrofit [-]: IE2 is the usual class of new drives (common practice). */
export const DEFAULT_NEW_DRIVE_CLASS: DriveClass = 'IE2';

/** IEC 61800-9-2 class assumed for a drive already fitted when not given [-] (common practice). */
export const DEFAULT_EXISTING_DRIVE_CLASS: DriveClass = 'IE1';

/**
 * From this year of installation, a motor of unknown class is assumed to be at least IE2: the EU
 * minimum from 16 June 2011 (Regulation (EC) No 640/2009), below the US EPAct level in force since 1997.
 * Before it (or with no year), an unknown class takes the below-IE1 default.
 */
export const CLASS_REGIME_START_YEAR = 2011;
