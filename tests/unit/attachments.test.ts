import exifr from 'exifr'
import { PDFDocument } from 'pdf-lib'
import sharp from 'sharp'
import { describe, expect, it } from 'vitest'
import { safeFileName } from '#shared/attachments/rules'
import { checkFile } from '../../server/utils/attachments/content'

/*
 * The content checks of an attachment, on real bytes made here: the type from the bytes,
 * never the name; a photo written again without its metadata; a PDF that must load.
 */

/** A small JPEG carrying a camera make and a GPS position (Milwaukee, invented for the test). */
async function photoWithLocation(width = 40, height = 30, orientation?: number) {
  const image = sharp({ create: { width, height, channels: 3, background: '#aa3344' } })
    .jpeg()
    .withExif({ IFD0: { Make: 'TestCam' }, IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '43/1 2/1 30/1', GPSLongitudeRef: 'W', GPSLongitude: '87/1 54/1 0/1' } })
  return (orientation ? image.withMetadata({ orientation }) : image).toBuffer()
}

async function refusal(bytes: Buffer) {
  return checkFile(bytes).then(() => null, (error: { statusCode: number, data: { fieldErrors: Record<string, string[]> } }) => ({ status: error.statusCode, errors: error.data.fieldErrors }))
}

describe('attachment content checks', () => {
  it('refuses an HTML page named photo.jpg: the bytes decide, not the name', async () => {
    const html = Buffer.from('<!doctype html><html><body><script>alert(1)</script></body></html>')
    expect(await refusal(html)).toEqual({ status: 415, errors: { file: ['validation.attachments.type'] } })
  })

  it('accepts a PDF whatever its name says, and names the download .pdf', async () => {
    const document = await PDFDocument.create()
    document.addPage()
    document.addPage()
    const bytes = Buffer.from(await document.save())
    const checked = await checkFile(bytes)
    expect(checked).toMatchObject({ kind: 'pdf', mime: 'application/pdf', extension: 'pdf', pages: 2 })
    expect(checked.bytes.equals(bytes)).toBe(true)
    expect(safeFileName('outside-lab-report.txt', checked.extension)).toBe('outside-lab-report.pdf')
  })

  it('refuses a file that starts like a PDF but does not load as one', async () => {
    expect(await refusal(Buffer.from('%PDF-1.7\nthis is not a document'))).toEqual({ status: 400, errors: { file: ['validation.attachments.unreadable'] } })
  })

  it('drops the GPS position and camera details of a photo (read back with exifr)', async () => {
    const original = await photoWithLocation()
    // The photo really carries them before the check, or this test could not fail.
    expect(await exifr.gps(original)).toMatchObject({ latitude: expect.closeTo(43.0417, 3), longitude: expect.closeTo(-87.9, 3) })
    const checked = await checkFile(original)
    expect(checked).toMatchObject({ kind: 'image', mime: 'image/jpeg', width: 40, height: 30 })
    expect(await exifr.gps(checked.bytes)).toBeUndefined()
    expect(await exifr.parse(checked.bytes, true)).toBeUndefined()
  })

  it('turns a photo upright by its orientation tag before the tag is dropped', async () => {
    // EXIF orientation 6: the camera was turned a quarter; shown upright it is 30 x 40.
    const checked = await checkFile(await photoWithLocation(40, 30, 6))
    expect([checked.width, checked.height]).toEqual([30, 40])
  })

  it('fits a large photo inside 2400 pixels on its longer edge, keeping its shape', async () => {
    const wide = await sharp({ create: { width: 3600, height: 1200, channels: 3, background: '#336699' } }).png().toBuffer()
    const checked = await checkFile(wide)
    expect([checked.width, checked.height]).toEqual([2400, 800])
    expect((await sharp(checked.bytes).metadata()).format).toBe('jpeg')
  })

  it('refuses an empty file and one over 10 MB', async () => {
    expect(await refusal(Buffer.alloc(0))).toEqual({ status: 400, errors: { file: ['validation.attachments.empty'] } })
    expect(await refusal(Buffer.alloc(10 * 1024 * 1024 + 1, 0x20))).toEqual({ status: 413, errors: { file: ['validation.attachments.tooLarge'] } })
  })

  it('makes a file name safe to show and to offer as a download name', () => {
    expect(safeFileName('C:\\Users\\me\\Desktop\\rash "left".HEIC', 'jpg')).toBe('rash left.jpg')
    expect(safeFileName('../../etc/passwd', 'pdf')).toBe('passwd.pdf')
    expect(safeFileName('', 'jpg')).toBe('attachment.jpg')
  })
})
