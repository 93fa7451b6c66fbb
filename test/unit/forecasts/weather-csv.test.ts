/** Hourly weather tables read in the browser for the forecast page. */
import { describe, expect, test } from 'vitest';
import { parseWeatherCsv } from '@/app/forecasts/weather-csv';
import { parseQuantity } from '@/analysis/units/parse-quantity';

describe('parseWeatherCsv', () => {
  test('reads units from the headers and passes them on as quantities', () => {
    const t = parseWeatherCsv('hour,Air temp (°F),RH (%),Wind (mph),Solar (W/m2),Cloud (%)\n0,68,70,3,0,20\n1,66.5,74,2,0,40\n', 'si');
    expect(t.issues).toEqual([]);
    expect(t.rows).toEqual([
      { airTemp: '68 degF', relativeHumidity: 0.7, wind: '3 mph', solar: '0 W/m^2', cloudCover: 0.2 },
      { airTemp: '66.5 degF', relativeHumidity: 0.74, wind: '2 mph', solar: '0 W/m^2', cloudCover: 0.4 },
    ]);
    // 68 °F = 20 °C exactly (°F = °C × 9/5 + 32)
    expect(parseQuantity(t.rows[0].airTemp, 'temperature', 'airTemp')).toBeCloseTo(20, 12);
    expect(t.columns.map((c) => c.meaning)).toEqual(['air temperature, °F', 'relative humidity, %', 'wind, mph', 'sun (global irradiance), W/m²', 'cloud cover, %']);
  });

  test('a semicolon table with decimal commas, a dew point and winds in knots', () => {
    const t = parseWeatherCsv('\uFEFFStunde;Lufttemperatur [C];Dew point [C];Wind [kn]\n0;18,5;12,0;10\n', 'us');
    expect(t.issues).toEqual([]);
    // 1 knot = 1852 m per hour exactly (NIST SP 811, App. B.8)
    expect(t.rows[0]).toEqual({ airTemp: '18.5 degC', dewPoint: '12 degC', wind: `${(10 * 1852) / 3600} m/s` });
  });

  test('temperatures without a unit are in the user’s units', () => {
    expect(parseWeatherCsv('air,humidity\n70,50\n', 'us').rows[0]).toEqual({ airTemp: '70 degF', relativeHumidity: 0.5 });
    expect(parseWeatherCsv('air,humidity\n21,50\n', 'si').rows[0]).toEqual({ airTemp: '21 degC', relativeHumidity: 0.5 });
  });

  test('bad cells are named by line and column, and the table is refused', () => {
    const t = parseWeatherCsv('air (C),RH (%),wind (m/s)\n20,60,1\n19,,1\n18,130,1\nwarm,60,1\n17,60,-2\n', 'si');
    expect(t.rows).toEqual([]);
    expect(t.issues).toEqual([
      { line: 3, message: 'RH (%): a relative humidity must be 0–100 % ("")' },
      { line: 4, message: 'RH (%): a relative humidity must be 0–100 % ("130")' },
      { line: 5, message: 'air (C): not a number ("warm")' },
      { line: 6, message: 'wind (m/s): must be a number of 0 or more ("-2")' },
    ]);
  });

  test('missing columns are named before any row is read', () => {
    expect(parseWeatherCsv('time,wind\n0,1\n', 'si').issues.map((i) => i.message)).toEqual([
      'no air temperature column: name one "air temperature (°C)" (columns: time, wind)',
      'no humidity: add a "relative humidity (%)" or a "dew point" column',
    ]);
    expect(parseWeatherCsv('', 'si').issues).toEqual([{ line: 1, message: 'the file is empty' }]);
  });
});
