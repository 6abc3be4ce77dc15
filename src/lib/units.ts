/** Temperature units. NIST SP 811 (2008), appendix B.8: t/°C = (t/°F − 32)/1.8. */
export const fahrenheitToCelsius = (fahrenheit: number) => ((fahrenheit - 32) * 5) / 9;

/** The inverse: t/°F = 1.8·t/°C + 32. */
export const celsiusToFahrenheit = (celsius: number) => (celsius * 9) / 5 + 32;
