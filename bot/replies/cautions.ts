/**
 * Brief safety wording for tanks that can hurt someone. The wording is common practice for fuels, LPG and
 * water-treatment chemicals, states no regulation numbers, and always defers to local codes, the product's
 * safety data sheet and licensed practice: the bot is a planning aid, not a safety authority.
 */

/** What the tank holds, as the bot classifies a product name. */
export type Hazard = 'fuel' | 'lpg' | 'hypochlorite' | 'acid' | 'caustic' | 'chemical' | 'none';

/** Why the reply is shown: an ordinary reading or answer, a delivery, a tank above its safe fill, running low. */
export type CautionSituation = 'reading' | 'delivery' | 'overfill' | 'low';

/**
 * Keywords per hazard, checked in this order (so "fluorosilicic acid" is an acid before it is a chemical, and
 * "fuel oil" is a fuel). Whole words only, so "propane" never matches inside another word.
 */
const HAZARD_WORDS: [Hazard, RegExp][] = [
  ['lpg', /\b(lpg|propane|butane|autogas|liquefied petroleum)\b/],
  [
    'fuel',
    /\b(diesel|gasoline|petrol|kerosene|kero|paraffin|heating oil|fuel oil|fuel|biodiesel|jet|avgas|ulsd|red diesel|gas oil)\b/,
  ],
  ['hypochlorite', /\b(hypochlorite|hypo|bleach|chlorine|naocl|sodium hypo)\b/],
  [
    'acid',
    /\b(acid|acids|muriatic|sulfuric|sulphuric|hydrochloric|hcl|h2so4|fluorosilicic|hydrofluosilicic)\b/,
  ],
  ['caustic', /\b(caustic|lye|hydroxide|naoh|koh)\b/],
  [
    'chemical',
    /\b(chemical|chemicals|ferric|alum|aluminium sulfate|aluminum sulfate|polymer|coagulant|fluoride|ammonia|peroxide|pac|permanganate|bisulfite|methanol|corrosive)\b/,
  ],
];

/** Classifies a free-text product name ("Diesel #2", "12.5% sodium hypochlorite") into a hazard. */
export function hazardOf(product: string | undefined): Hazard {
  const text = (product ?? '').toLowerCase();
  for (const [hazard, pattern] of HAZARD_WORDS) {
    if (pattern.test(text)) return hazard;
  }
  return 'none';
}

const DEFER = 'Follow local codes and your licensed supplier or safety officer.';

const PRODUCT_CAUTION: Record<Exclude<Hazard, 'none'>, string> = {
  fuel: 'Fuel is flammable: no smoking, sparks or open flame near the tank, and have spill kit and containment ready.',
  lpg: 'LPG is filled only by a licensed supplier and never past the tank’s marked maximum. If you smell gas, leave the area and call the supplier or emergency services.',
  hypochlorite:
    'Hypochlorite must never meet acids or ammonia (toxic gas). Wear the protective equipment on the safety data sheet.',
  acid: 'Acid is corrosive: keep it apart from hypochlorite and caustic, and wear the protective equipment on the safety data sheet.',
  caustic:
    'Caustic is corrosive: keep it apart from acids, and wear the protective equipment on the safety data sheet.',
  chemical: 'Handle with the protective equipment on the product’s safety data sheet.',
};

const SITUATION_CAUTION: Record<CautionSituation, string> = {
  reading: '',
  // Common practice: check room in the tank (ullage) and the right fill point before any transfer starts.
  delivery:
    'Before a delivery, check the room left in the tank against the ticket and that the hose goes to the right, labelled fill point.',
  overfill:
    'Above the safe fill level: stop any filling, check the vent and for leaks, and follow your site’s overfill procedure.',
  low: '',
};

/**
 * The caution for a product in a situation, or undefined when there is nothing to say (water that is not
 * overfilling). Overfill applies to every tank: even water can flood a site or burst a vent.
 */
export function cautionFor(
  product: string | undefined,
  situation: CautionSituation = 'reading',
): string | undefined {
  const hazard = hazardOf(product);
  const parts: string[] = [];
  if (situation === 'overfill') parts.push(SITUATION_CAUTION.overfill);
  if (hazard !== 'none') {
    parts.push(PRODUCT_CAUTION[hazard]);
    if (situation === 'delivery') parts.push(SITUATION_CAUTION.delivery);
  }
  if (parts.length === 0) return undefined;
  // LPG always says "licensed"; every caution defers to the codes that actually govern the site.
  parts.push(DEFER);
  return parts.join(' ');
}

/**
 * Said beside any refill or pick-up quantity. Common practice: a quantity worked out from the forecast is an
 * estimate, so the crew gauges the tank before the product is moved (and never fills past the safe level).
 */
export function gaugeFirstNote(mode: 'order' | 'pick-up'): string {
  return `gauge the tank before ${mode === 'pick-up' ? 'the pick-up' : 'filling'}, the quantity is an estimate from the forecast`;
}
