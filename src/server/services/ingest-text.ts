/** Text the database can store: no NUL (PostgreSQL text and jsonb refuse it). */
export const storable = (text: string) => text.replace(/\u0000/g, '');
/** JSON the database can store in jsonb (no escaped NUL). */
export const storableJson = (value: unknown) => JSON.stringify(value).replace(/\\u0000/g, '');
