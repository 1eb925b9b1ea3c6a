/**
 * The method section of a worksheet: what was computed and where each formula and
 * threshold comes from, in plain words (after reference/TRADE-FACTS.md). Written with
 * characters every PDF standard font can show (sqrt, "y0", "beta"), so the text reads the
 * same in the PDF and in a spreadsheet.
 */
import { LARGE_GROSS_PERCENT, LARGE_NET_PERCENT } from '../domain/adjustment-grid.js';
import type { Transform } from '../domain/estimate-result.js';

export interface MethodParagraph {
  heading: string;
  text: string;
}

export function methodParagraphs(transform: Transform): MethodParagraph[] {
  const paragraphs: MethodParagraph[] = [
    {
      heading: 'Sales used',
      text:
        'The sales used are the included sales of the market that record every characteristic the model needs; the others are listed with the reason. ' +
        'Age is the year of the sale minus the year built (for the subject, the year of the effective date). Months since sale is the number of days from the sale to the effective date divided by 30.4375: the market-conditions term.',
    },
    {
      heading: 'Fit',
      text:
        'Each predictor is turned into z-scores with the mean and sample standard deviation of the sales used, and the response (the sale price, or its natural log) is fitted by least squares through a Householder QR factorization of the design rather than the normal equations, which keeps the digits. ' +
        'Unit coefficients are b = beta / s for a predictor with standard deviation s; the standardized coefficient is b·s / s_y. With p coefficients including the intercept and n sales, s² = residual sum of squares / (n - p); t = b / standard error, with two-sided p values from Student\'s t on n - p degrees of freedom, and F compares the explained and residual variance. ' +
        'Sources: Montgomery, Peck & Vining, Introduction to Linear Regression Analysis (5th ed., 2012), ch. 3; Kutner, Nachtsheim, Neter & Li, Applied Linear Statistical Models (5th ed., 2005), ch. 6.',
    },
    {
      heading: 'The subject and its intervals',
      text:
        'The subject\'s leverage h0 = x0\'(X\'X)^-1 x0 measures how far its characteristics lie from the centre of the sales. With y0 the fitted value at the subject and t the two-sided Student\'s t value for the chosen level on n - p degrees of freedom, ' +
        'the confidence interval for the mean price of properties like the subject is y0 ± t·s·sqrt(h0), and the prediction interval for one sale of the subject is y0 ± t·s·sqrt(1 + h0), always the wider of the two. ' +
        'A subject value outside the range of the sales, or a leverage above the largest among the sales (hidden extrapolation, Montgomery, Peck & Vining §3.8), means the estimate extrapolates beyond what the sales support.',
    },
  ];
  if (transform === 'log')
    paragraphs.push({
      heading: 'Log price',
      text:
        'With the log transform the intervals are computed on the log scale and converted back with exp, so they are not symmetric around the value. exp(y0) alone estimates the median price; the value is exp(y0) times Duan\'s smearing factor, the mean of exp(residual) over the sales used (Duan 1983, Journal of the American Statistical Association 78:605-610). ' +
        'A coefficient b means a change of 100·(exp(b) - 1) % in price per unit of the predictor.',
    });
  paragraphs.push(
    {
      heading: 'Collinearity',
      text:
        'The variance inflation factor of a predictor is 1 / (1 - R²) of that predictor regressed on the others, read off the inverse correlation matrix of the predictors; above 5 is a caution and above 10 serious (Hair et al., Multivariate Data Analysis). ' +
        'Condition indices come from the singular values of the design with its intercept, each column scaled to unit length; an index above 30 with two or more variance-decomposition proportions above 0.5 marks terms that are nearly dependent (Belsley, Kuh & Welsch, Regression Diagnostics, 1980).',
    },
    {
      heading: 'Outliers and influence',
      text:
        'A sale\'s leverage h above 2p/n marks unusual characteristics (Hoaglin & Welsch 1978). The externally studentized residual (the residual over its standard error with the sale itself left out) beyond ±3 marks an outlier. ' +
        'Cook\'s distance D = r²·h / (p·(1 - h)), with r the internally studentized residual, above 4/n marks an influential sale and above 1 a sale that alone moves the fit (Cook 1977). DFFITS = t·sqrt(h / (1 - h)) is the change in the sale\'s own fitted value when it is left out, in standard errors.',
    },
    {
      heading: 'Leave-one-out check and ratio study',
      text:
        'The PRESS residual e / (1 - h) is the error of predicting a sale from all the other sales, found without refitting (Allen 1974); PRESS is the sum of their squares and the predicted R² is 1 - PRESS / total sum of squares. ' +
        'The ratio study compares each leave-one-out prediction with the sale price: ratio = prediction / price. COD = 100 × the mean absolute difference of the ratios from their median, divided by the median; PRD = mean ratio / (sum of predictions / sum of prices); ' +
        'PRB = the slope of (ratio - median) / median on log2 of a value proxy (half the prediction over the median plus half the price). Definitions and the usual ranges follow the IAAO Standard on Ratio Studies (2013); those ranges are advisory, and a study over few sales is indicative only.',
    },
    {
      heading: 'Residual checks',
      text:
        'Koenker\'s studentized form of the Breusch-Pagan test (n·R² of the squared residuals on the predictors, chi-square with k degrees of freedom) looks for a spread that changes with the predictors; the Jarque-Bera test looks for residuals that are not normal and is only advisory below 30 sales. A p value below 0.05 gives a warning.',
    },
    {
      heading: 'Adjustment grid',
      text:
        (transform === 'log'
          ? 'Each sale\'s price is adjusted toward the subject by the fitted coefficients: adjusted price = sale price × exp(sum of b·(subject value - sale value)); each predictor\'s column shows the change it makes alone, so percentage adjustments multiply and the columns need not add up to the total. '
          : 'Each sale\'s price is adjusted toward the subject by the fitted coefficients: adjustment = b·(subject value - sale value) for each predictor, and adjusted price = sale price + the sum of the adjustments; the mean adjusted price over the sales used equals the estimate. ') +
        `Net % = 100 × (adjusted price - sale price) / sale price; gross % = 100 × the sum of the absolute adjustments / sale price. Sales above ${LARGE_NET_PERCENT} % net or ${LARGE_GROSS_PERCENT} % gross are flagged after a lender guideline that was withdrawn in December 2014 (Fannie Mae Selling Guide announcement SEL-2014-16): a flag to explain, not a rule.`,
    },
    {
      heading: 'This record',
      text:
        'The worksheet is written from the estimate as it was saved: the sales, subject, model and results of that moment. Later changes to the market\'s sales do not change it, and the same saved estimate always gives the same worksheet, so it can be kept in the workfile (USPAP Record Keeping Rule).',
    },
  );
  return paragraphs;
}
