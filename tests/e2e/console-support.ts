import { writeFileSync } from 'node:fs';
import { PNG } from 'pngjs';
import type { Page } from 'playwright-core';
import { insertClient, insertOffice, insertPerson, insertStaff } from '../factories/accounts';
import { insertDay } from '../factories/days';
import { insertBooking } from '../server/console-support';
import type { TestApp } from '../setup/test-app';

/**
 * A Y4M (YUV4MPEG2) video for Chromium's fake camera showing one PNG centred on white, in
 * 4:2:0 with full-range ("jpeg") chroma siting: header, then "FRAME\n" + Y + U + V per frame.
 */
export function writeY4m(file: string, png: Buffer, width = 640, height = 480, frames = 10) {
  const image = PNG.sync.read(png);
  const luma = Buffer.alloc(width * height, 255);
  const left = Math.floor((width - image.width) / 2);
  const top = Math.floor((height - image.height) / 2);
  for (let y = 0; y < image.height; y += 1) {
    for (let x = 0; x < image.width; x += 1) {
      const offset = (y * image.width + x) * 4;
      const value =
        0.299 * image.data[offset]! +
        0.587 * image.data[offset + 1]! +
        0.114 * image.data[offset + 2]!;
      const targetX = left + x;
      const targetY = top + y;
      if (targetX >= 0 && targetX < width && targetY >= 0 && targetY < height) {
        luma[targetY * width + targetX] = Math.round(value);
      }
    }
  }
  const chroma = Buffer.alloc((width / 2) * (height / 2), 128);
  const frame = Buffer.concat([Buffer.from('FRAME\n'), luma, chroma, chroma]);
  const header = Buffer.from(`YUV4MPEG2 W${width} H${height} F10:1 Ip A1:1 C420jpeg\n`);
  writeFileSync(file, Buffer.concat([header, ...Array.from({ length: frames }, () => frame)]));
}

/** Northlight's photographer on a Halvorsen & Pike day in Leeds with two stations. */
export async function consoleScenario(testApp: TestApp, bookings: number) {
  const db = testApp.db;
  const client = await insertClient(db, { name: 'Halvorsen & Pike Engineering' });
  const office = await insertOffice(db, client.id, 'Leeds', 'Europe/London');
  const photographer = await insertStaff(db, { role: 'photographer' });
  const day = await insertDay(db, {
    clientId: client.id,
    officeId: office.id,
    photographerIds: [photographer.id, photographer.id],
    date: new Date().toISOString().slice(0, 10),
  });
  const names = ['Aino', 'Bram', 'Carla', 'Dries', 'Edda', 'Femke', 'Gil', 'Hanna'];
  const people = [];
  for (let index = 0; index < bookings; index += 1) {
    const person = await insertPerson(db, client.id, {
      officeId: office.id,
      givenName: names[index % names.length],
    });
    const booking = await insertBooking(db, {
      dayId: day.id,
      stationId: day.stations[0]!.id,
      personId: person.id,
      startsAt: new Date(Date.now() + (10 + index * 5) * 60_000),
      flashSensitive: index === 0,
    });
    people.push({ ...person, booking, givenName: names[index % names.length]! });
  }
  return { client, office, photographer, day, people };
}

/** Every visible button, link, tab and input is at least 44 x 44 CSS px (our tablet rule). */
export async function smallTouchTargets(page: Page) {
  return page.evaluate(() =>
    Array.from(
      document.querySelectorAll<HTMLElement>('button, a[href], [role="tab"], input, select'),
    )
      .filter((element) => element.getClientRects().length > 0)
      .map((element) => {
        const box = element.getBoundingClientRect();
        return {
          text: (element.textContent ?? element.getAttribute('aria-label') ?? '')
            .trim()
            .slice(0, 40),
          width: Math.round(box.width),
          height: Math.round(box.height),
        };
      })
      .filter((target) => target.width < 44 || target.height < 44),
  );
}
