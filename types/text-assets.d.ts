// CSV files imported as text by the pane's preview mode (webpack `asset/source`).
declare module "*.csv" {
  const text: string;
  export default text;
}
