/** A UTC DATETIME literal with milliseconds (the app's connections run at +00:00). */
export const sqlTime = (d: Date) => d.toISOString().slice(0, 23).replace('T', ' ');
