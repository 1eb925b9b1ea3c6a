/** Number, money and area formatting for pages: the shared formatters of domain/format.ts. */
export { areaLabel, currencySymbol, formatArea, formatMoney, formatNumber, formatTime } from '../../domain/format.js';
